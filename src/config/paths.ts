/** Every route path of the client, and builders for links with parameters. */
export const paths = {
  home: '/',
  pricing: '/pricing',
  signUp: '/sign-up',
  /** the link e-mailed at sign-up: confirms the address and creates the firm */
  confirmSignUp: (token = ':token') => `/sign-up/confirm/${token}`,
  signIn: '/sign-in',
  forgotPassword: '/forgot-password',
  resetPassword: (token = ':token') => `/reset-password/${token}`,
  invitation: (token = ':token') => `/invitations/${token}`,
  firm: {
    root: '/app',
    overview: '/app',
    staff: '/app/staff',
    settings: '/app/settings',
    billing: '/app/billing',
    business: '/app/business',
    panel: (panelId = ':panelId') => `/app/panels/${panelId}`,
    clients: '/app/clients',
    client: (clientId = ':clientId') => `/app/clients/${clientId}`,
    newSite: (clientId = ':clientId') => `/app/clients/${clientId}/sites/new`,
    site: (siteId = ':siteId') => `/app/sites/${siteId}`,
    editSite: (siteId = ':siteId') => `/app/sites/${siteId}/edit`,
    premises: (siteId = ':siteId') => `/app/sites/${siteId}/premises`,
    coverage: (siteId = ':siteId') => `/app/sites/${siteId}/coverage`,
    jobs: '/app/jobs',
    job: (jobId = ':jobId') => `/app/jobs/${jobId}`,
    today: '/app/today',
    schedule: '/app/schedule',
  },
  operator: {
    root: '/operator',
    tenants: '/operator',
    tenant: (tenantId = ':tenantId') => `/operator/firms/${tenantId}`,
    revenue: '/operator/revenue',
  },
  portal: {
    root: '/portal',
    site: (siteId = ':siteId') => `/portal/sites/${siteId}`,
    coverage: (siteId = ':siteId') => `/portal/sites/${siteId}/coverage`,
    devices: (siteId = ':siteId') => `/portal/sites/${siteId}/devices`,
    service: (siteId = ':siteId') => `/portal/sites/${siteId}/service`,
    contacts: (siteId = ':siteId') => `/portal/sites/${siteId}/contacts`,
    documents: (siteId = ':siteId') => `/portal/sites/${siteId}/documents`,
  },
  /** A firm's public portal pages, by its short name (before the household signs in). */
  firmPortal: {
    signIn: (shortName = ':shortName') => `/p/${shortName}`,
    forgotPassword: (shortName = ':shortName') => `/p/${shortName}/forgot-password`,
    resetPassword: (shortName = ':shortName', token = ':token') => `/p/${shortName}/reset-password/${token}`,
    invitation: (shortName = ':shortName', token = ':token') => `/p/${shortName}/invitations/${token}`,
  },
} as const;

/** Where a signed-in person lands. */
export function homeFor(role: string | undefined): string {
  if (role === 'operator') return paths.operator.root;
  if (role === 'client') return paths.portal.root;
  return paths.firm.overview;
}
