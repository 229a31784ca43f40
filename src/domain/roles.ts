/** The five roles of product.md. */
export const ROLES = ['operator', 'owner', 'coordinator', 'technician', 'client'] as const;
export type Role = (typeof ROLES)[number];

/** Roles that work for a firm (have a seat). */
export const STAFF_ROLES = ['owner', 'coordinator', 'technician'] as const;
export type StaffRole = (typeof STAFF_ROLES)[number];

/** Roles an owner may hand out by invitation or role change (one owner per firm). */
export const INVITABLE_STAFF_ROLES = ['coordinator', 'technician'] as const;
export type InvitableStaffRole = (typeof INVITABLE_STAFF_ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  operator: 'Service operator',
  owner: 'Owner',
  coordinator: 'Coordinator',
  technician: 'Technician',
  client: 'Client',
};

export const ROLE_DESCRIPTIONS: Record<StaffRole, string> = {
  owner: 'Everything in the firm, billing and staff included.',
  coordinator: 'Clients, sites, jobs, scheduling and reports. No billing, no staff roles.',
  technician: 'Reads every site and job; works their own jobs; edits panels, zones and premises.',
};
