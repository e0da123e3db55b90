/** Every route path of the app, written once. `path` is the router pattern, `getHref` builds a link. */
export const paths = {
  home: { path: '/', getHref: () => '/' },
  auth: {
    signIn: {
      path: '/sign-in',
      getHref: (redirectTo?: string | null) =>
        redirectTo ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in',
    },
    signUp: { path: '/sign-up', getHref: () => '/sign-up' },
    forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
    resetPassword: { path: '/reset-password', getHref: (token: string) => `/reset-password?token=${encodeURIComponent(token)}` },
    invitation: { path: '/invitations/:token', getHref: (token: string) => `/invitations/${encodeURIComponent(token)}` },
  },
  admin: {
    shops: { path: '/admin/shops', getHref: () => '/admin/shops' },
    revenue: { path: '/admin/revenue', getHref: () => '/admin/revenue' },
  },
  jobs: { path: '/jobs', getHref: () => '/jobs' },
  newJob: { path: '/jobs/new', getHref: (customerUserId?: string) => (customerUserId ? `/jobs/new?customer=${encodeURIComponent(customerUserId)}` : '/jobs/new') },
  job: { path: '/jobs/:jobId', getHref: (jobId: string) => `/jobs/${encodeURIComponent(jobId)}` },
  vehicles: { path: '/vehicles', getHref: () => '/vehicles' },
  vehicle: { path: '/vehicles/:vehicleId', getHref: (vehicleId: string) => `/vehicles/${encodeURIComponent(vehicleId)}` },
  customers: { path: '/customers', getHref: () => '/customers' },
  customer: { path: '/customers/:customerId', getHref: (customerId: string) => `/customers/${encodeURIComponent(customerId)}` },
  team: { path: '/team', getHref: () => '/team' },
  reports: { path: '/reports', getHref: () => '/reports' },
  kits: {
    list: { path: '/kits', getHref: () => '/kits' },
    overview: { path: '/kits/overview', getHref: () => '/kits/overview' },
    detail: { path: '/kits/:kitId', getHref: (kitId: string) => `/kits/${encodeURIComponent(kitId)}` },
  },
  dealers: {
    list: { path: '/dealers', getHref: () => '/dealers' },
    detail: { path: '/dealers/:dealerId', getHref: (dealerId: string) => `/dealers/${encodeURIComponent(dealerId)}` },
  },
  settings: {
    root: { path: '/settings', getHref: () => '/settings' },
    profile: { path: '/settings/profile', getHref: () => '/settings/profile' },
    shop: { path: '/settings/shop', getHref: () => '/settings/shop' },
    packages: { path: '/settings/packages', getHref: () => '/settings/packages' },
    notifications: { path: '/settings/notifications', getHref: () => '/settings/notifications' },
  },
  datalogs: {
    report: { path: '/datalogs/:datalogId', getHref: (datalogId: string) => `/datalogs/${encodeURIComponent(datalogId)}` },
    jobLogs: { path: '/jobs/:jobId/logs', getHref: (jobId: string) => `/jobs/${encodeURIComponent(jobId)}/logs` },
  },
  billing: {
    shop: { path: '/billing', getHref: () => '/billing' },
    /** A dealer user's own statement. */
    myStatement: { path: '/billing/statement', getHref: () => '/billing/statement' },
    statement: { path: '/billing/statement/:dealerId', getHref: (dealerId: string) => `/billing/statement/${encodeURIComponent(dealerId)}` },
  },
  publicShop: { path: '/s/:slug', getHref: (slug: string) => `/s/${encodeURIComponent(slug)}` },
  publicVerify: { path: '/s/:slug/verify', getHref: (slug: string, token: string) => `/s/${encodeURIComponent(slug)}/verify?token=${encodeURIComponent(token)}` },
  dev: {
    mailbox: { path: '/dev/mailbox', getHref: () => '/dev/mailbox' },
  },
  fileDiff: {
    path: '/jobs/:jobId/files/diff',
    getHref: (jobId: string, a: string, b: string) => `/jobs/${encodeURIComponent(jobId)}/files/diff?${new URLSearchParams({ a, b })}`,
  },
} as const;
