/** The invented demo scenario: two shops, one dealer, and a person for every role. Password for all: revloop-demo. */
export const DEMO_PASSWORD = 'revloop-demo';

export const DEMO_ADMIN = { email: 'admin@revloop.test', name: 'Pat Okafor' } as const;

export const KESTREL = {
  name: 'Kestrel Calibration Works',
  currency: 'USD',
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
  ],
  dealerCustomers: [
    { email: 'dcustomer@kestrel.test', name: 'Morgan Pryce' },
    { email: 'taylor.reyes@kestrel.test', name: 'Taylor Reyes' },
  ],
} as const;

export const HARBOR = {
  name: 'Harbor Dyno & Tune',
  currency: 'EUR',
  owner: { email: 'owner@harbor.test', name: 'Elena Marsh' },
  tuners: [{ email: 'tuner@harbor.test', name: 'Tomas Reed' }],
  customers: [
    { email: 'customer@harbor.test', name: 'Noor Haddad' },
    { email: 'lena.fischer@harbor.test', name: 'Lena Fischer' },
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
