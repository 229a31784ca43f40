/**
 * Who gets what from every API route: one line per route, ten answers in this order —
 *
 *   signed out, operator | owner, coordinator, technician of the firm | the same three roles of
 *   another firm | the firm's household (client), another firm's household
 *
 * `ok` means the call got past the gates: 2xx, or a 4xx about the input or the firm's state
 * (400, 402, 409, 413, 415), never 401/403/404 and never a 5xx. The ids in the path are the
 * firm's own records (tests/support/route-world.ts). A route in the router without a line here
 * fails tests/server/route-matrix.test.ts, and so does a line without a route.
 */
export const ROUTE_TABLE: Record<string, string> = {
  // session
  'DELETE /api/session': 'ok ok | ok ok ok | ok ok ok | ok ok',
  'GET /api/session': 'ok ok | ok ok ok | ok ok ok | ok ok',
  'POST /api/session': 'ok ok | ok ok ok | ok ok ok | ok ok',
  // signup
  'POST /api/signup': 'ok ok | ok ok ok | ok ok ok | ok ok',
  // a sign-up waiting for its owner to confirm: public, the token is the key
  'GET /api/signups/:token': 'ok ok | ok ok ok | ok ok ok | ok ok',
  'POST /api/signups/:token': 'ok ok | ok ok ok | ok ok ok | ok ok',
  // password-resets
  'POST /api/password-resets': 'ok ok | ok ok ok | ok ok ok | ok ok',
  'POST /api/password-resets/:token': 'ok ok | ok ok ok | ok ok ok | ok ok',
  // invitations
  'GET /api/invitations/:token': 'ok ok | ok ok ok | ok ok ok | ok ok',
  'POST /api/invitations/:token/accept': 'ok ok | ok ok ok | ok ok ok | ok ok',
  // public
  'GET /api/public/firms/:shortName': 'ok ok | ok ok ok | ok ok ok | ok ok',
  'GET /api/public/firms/:shortName/logo': 'ok ok | ok ok ok | ok ok ok | ok ok',
  // staff
  'GET /api/staff': '401 403 | ok ok ok | ok ok ok | ok ok',
  'DELETE /api/staff/:userId': '401 403 | ok 403 403 | 404 404 404 | 404 404',
  'PATCH /api/staff/:userId': '401 403 | ok 403 403 | 404 404 404 | 404 404',
  'GET /api/staff/invitations': '401 403 | ok ok 403 | ok ok 403 | 403 403',
  'POST /api/staff/invitations': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'DELETE /api/staff/invitations/:invitationId': '401 403 | ok 404 404 | 404 404 404 | 404 404',
  'POST /api/staff/invitations/:invitationId/resend': '401 403 | ok 404 404 | 404 404 404 | 404 404',
  // firm
  'GET /api/firm': '401 403 | ok ok ok | ok ok ok | ok ok',
  'PATCH /api/firm': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'GET /api/firm/business': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'GET /api/firm/checklists': '401 403 | ok ok ok | ok ok ok | 403 403',
  'PUT /api/firm/checklists': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'DELETE /api/firm/logo': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'GET /api/firm/logo': '401 403 | ok ok ok | ok ok ok | ok ok',
  'POST /api/firm/logo': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'GET /api/firm/upkeep-settings': '401 403 | ok ok ok | ok ok ok | 403 403',
  'PUT /api/firm/upkeep-settings': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  // billing
  'GET /api/billing': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'POST /api/billing/checkout': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'GET /api/billing/invoices': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  'POST /api/billing/portal': '401 403 | ok 403 403 | ok 403 403 | 403 403',
  // operator
  'GET /api/operator/revenue': '401 ok | 403 403 403 | 403 403 403 | 403 403',
  'GET /api/operator/tenants': '401 ok | 403 403 403 | 403 403 403 | 403 403',
  'GET /api/operator/tenants/:tenantId': '401 ok | 403 403 403 | 403 403 403 | 403 403',
  'GET /api/operator/tenants/:tenantId/invoices': '401 ok | 403 403 403 | 403 403 403 | 403 403',
  'POST /api/operator/tenants/:tenantId/restore': '401 ok | 403 403 403 | 403 403 403 | 403 403',
  'POST /api/operator/tenants/:tenantId/suspend': '401 ok | 403 403 403 | 403 403 403 | 403 403',
  // clients
  'GET /api/clients': '401 403 | ok ok ok | ok ok ok | ok ok',
  'POST /api/clients': '401 403 | ok ok 403 | ok ok 403 | 403 403',
  'DELETE /api/clients/:clientId': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  'GET /api/clients/:clientId': '401 403 | ok ok ok | 404 404 404 | ok 404',
  'PATCH /api/clients/:clientId': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  'GET /api/clients/:clientId/invitations': '401 403 | ok ok 404 | 404 404 404 | 404 404',
  'POST /api/clients/:clientId/invitations': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  'DELETE /api/clients/:clientId/invitations/:invitationId': '401 403 | ok ok 404 | 404 404 404 | 404 404',
  'POST /api/clients/:clientId/invitations/:invitationId/resend': '401 403 | ok ok 404 | 404 404 404 | 404 404',
  // sites
  'GET /api/sites': '401 403 | ok ok ok | ok ok ok | ok ok',
  'POST /api/sites': '401 403 | ok ok 403 | ok ok 403 | 403 403',
  'DELETE /api/sites/:siteId': '401 403 | ok ok 403 | 404 404 404 | 403 404',
  'GET /api/sites/:siteId': '401 403 | ok ok ok | 404 404 404 | ok 404',
  'PATCH /api/sites/:siteId': '401 403 | ok ok 403 | 404 404 404 | 403 404',
  'GET /api/sites/:siteId/contacts': '401 403 | ok ok ok | 404 404 404 | 403 404',
  'POST /api/sites/:siteId/contacts': '401 403 | ok ok 403 | 404 404 404 | 403 404',
  'PUT /api/sites/:siteId/contacts': '401 403 | ok ok 403 | 404 404 404 | 403 404',
  'GET /api/sites/:siteId/contacts/changes': '401 403 | ok ok ok | 404 404 404 | 403 404',
  'GET /api/sites/:siteId/coverage': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/sites/:siteId/documents': '401 403 | ok ok ok | 404 404 404 | 403 404',
  'POST /api/sites/:siteId/documents': '401 403 | ok ok ok | 404 404 404 | 403 404',
  'GET /api/sites/:siteId/floors': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/sites/:siteId/floors': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/sites/:siteId/history': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/sites/:siteId/panels': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/sites/:siteId/panels': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/sites/:siteId/passcode/reveal': '401 403 | ok ok ok | 404 404 404 | 403 404',
  'GET /api/sites/:siteId/premises': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // contacts
  'DELETE /api/contacts/:contactId': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  'PATCH /api/contacts/:contactId': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  // documents
  'DELETE /api/documents/:documentId': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  'PATCH /api/documents/:documentId': '401 403 | ok ok 403 | 404 404 404 | 404 404',
  'GET /api/documents/:documentId/file': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/documents/:documentId/thumbnail': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // panels
  'DELETE /api/panels/:panelId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/panels/:panelId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PATCH /api/panels/:panelId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/panels/:panelId/changes': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/panels/:panelId/programmed': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/panels/:panelId/programming-sheet.pdf': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/panels/:panelId/zones': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/panels/:panelId/zones': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/panels/:panelId/zones.csv': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/panels/:panelId/zones/import': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // zones
  'DELETE /api/zones/:zoneId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/zones/:zoneId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PATCH /api/zones/:zoneId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'DELETE /api/zones/:zoneId/pin': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PUT /api/zones/:zoneId/pin': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // floors
  'DELETE /api/floors/:floorId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PATCH /api/floors/:floorId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'DELETE /api/floors/:floorId/plan': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/floors/:floorId/plan': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/floors/:floorId/plan': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/floors/:floorId/rooms': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // rooms
  'DELETE /api/rooms/:roomId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PATCH /api/rooms/:roomId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/rooms/:roomId/openings': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // openings
  'DELETE /api/openings/:openingId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PATCH /api/openings/:openingId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // jobs
  'GET /api/jobs': '401 403 | ok ok ok | ok ok ok | 403 403',
  'POST /api/jobs': '401 403 | ok ok 403 | ok ok 403 | 403 403',
  'GET /api/jobs/:jobId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PATCH /api/jobs/:jobId': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/jobs/:jobId/files': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'GET /api/jobs/:jobId/report.pdf': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'POST /api/jobs/:jobId/transitions': '401 403 | ok ok ok | 404 404 404 | 404 404',
  'PUT /api/jobs/:jobId/walk-test': '401 403 | ok ok ok | 404 404 404 | 404 404',
  // portal
  'GET /api/portal/sites': '401 403 | 403 403 403 | 403 403 403 | ok ok',
  'GET /api/portal/sites/:siteId': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/contacts': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'PUT /api/portal/sites/:siteId/contacts': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/coverage': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/devices': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/documents': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/documents/:documentId/file': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/floors/:floorId/plan': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'GET /api/portal/sites/:siteId/service': '401 403 | 403 403 403 | 403 403 403 | ok 404',
  'POST /api/portal/sites/:siteId/service-requests': '401 403 | 403 403 403 | 403 403 403 | ok 404',
};

/** Routes the matrix does not call, each with the reason. */
export const EXCLUDED_ROUTES: Record<string, string> = {
  'GET /api/health': 'answers before sessions, the same to everyone: no caller to tell apart',
  'POST /api/webhooks/stripe': 'no session: the signature with the endpoint secret is its gate (tests/server/billing.test.ts)',
};
