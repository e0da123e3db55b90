/** The invented demo scenario: two shops, one dealer, and a person for every role. Password for all: revloop-demo. */
export const DEMO_PASSWORD = 'revloop-demo';

export const DEMO_ADMIN = { email: 'admin@revloop.test', name: 'Pat Okafor' } as const;

export const KESTREL = {
  name: 'Kestrel Calibration Works',
  currency: 'USD',
  slug: 'kestrel',
  description: 'Remote calibrations for turbocharged four- and six-cylinder engines and their automatic transmissions. Tuned on our own dyno data, revised from your logs until it is dialed in.',
  owner: { email: 'owner@kestrel.test', name: 'Dana Whitfield' },
  tuners: [
    { email: 'tuner@kestrel.test', name: 'Marco Lindqvist' },
    { email: 'tuner2@kestrel.test', name: 'Aiko Brennan' },
  ],
  dealer: {
    name: 'Ridgeline Garage',
    contactName: 'Sam Ortega',
    contactEmail: 'hello@ridgeline.test',
    phone: '+1 555 0142',
    user: { email: 'dealer@kestrel.test', name: 'Sam Ortega' },
  },
  customers: [
    { email: 'customer@kestrel.test', name: 'Jordan Hale' },
    { email: 'riley.moss@kestrel.test', name: 'Riley Moss' },
    { email: 'casey.nguyen@kestrel.test', name: 'Casey Nguyen' },
    // More invented customers without a listed sign-in, so the board holds a small shop's week of work.
    { email: 'priya.raman@kestrel.test', name: 'Priya Raman' },
    { email: 'dmitri.volkov@kestrel.test', name: 'Dmitri Volkov' },
    { email: 'sofia.marchetti@kestrel.test', name: 'Sofia Marchetti' },
    { email: 'ben.okonkwo@kestrel.test', name: 'Ben Okonkwo' },
    { email: 'hana.kobayashi@kestrel.test', name: 'Hana Kobayashi' },
    { email: 'luis.ferreira@kestrel.test', name: 'Luis Ferreira' },
    { email: 'grace.whitaker@kestrel.test', name: 'Grace Whitaker' },
    { email: 'owen.gallagher@kestrel.test', name: 'Owen Gallagher' },
    { email: 'mei.tan@kestrel.test', name: 'Mei Tan' },
    { email: 'kofi.mensah@kestrel.test', name: 'Kofi Mensah' },
    { email: 'ingrid.solberg@kestrel.test', name: 'Ingrid Solberg' },
    { email: 'rafael.ortiz@kestrel.test', name: 'Rafael Ortiz' },
    { email: 'nadia.petrova@kestrel.test', name: 'Nadia Petrova' },
    { email: 'tom.achterberg@kestrel.test', name: 'Tom Achterberg' },
    { email: 'wes.carlisle@kestrel.test', name: 'Wes Carlisle' },
  ],
  dealerCustomers: [
    { email: 'dcustomer@kestrel.test', name: 'Morgan Pryce' },
    { email: 'taylor.reyes@kestrel.test', name: 'Taylor Reyes' },
  ],
} as const;

export const HARBOR = {
  name: 'Harbor Dyno & Tune',
  currency: 'EUR',
  slug: 'harbor-dyno',
  description: 'Engine calibrations for daily drivers and track days, revised round by round from your logs.',
  owner: { email: 'owner@harbor.test', name: 'Elena Marsh' },
  tuners: [{ email: 'tuner@harbor.test', name: 'Tomas Reed' }],
  customers: [
    { email: 'customer@harbor.test', name: 'Noor Haddad' },
    { email: 'lena.fischer@harbor.test', name: 'Lena Fischer' },
    { email: 'jonas.berg@harbor.test', name: 'Jonas Berg' },
    { email: 'amelie.laurent@harbor.test', name: 'Amélie Laurent' },
    { email: 'karim.aziz@harbor.test', name: 'Karim Aziz' },
  ],
} as const;

export const DEMO_SIGN_INS: Array<[string, string]> = [
  ['platform admin', DEMO_ADMIN.email],
  ['Kestrel owner', KESTREL.owner.email],
  ['Kestrel tuner', KESTREL.tuners[0].email],
  ['Kestrel second tuner', KESTREL.tuners[1].email],
  ['Ridgeline dealer (Kestrel)', KESTREL.dealer.user.email],
  ['Kestrel direct customer', KESTREL.customers[0].email],
  ['Kestrel dealer customer', KESTREL.dealerCustomers[0].email],
  ['Harbor owner', HARBOR.owner.email],
  ['Harbor tuner', HARBOR.tuners[0].email],
  ['Harbor customer', HARBOR.customers[0].email],
];
