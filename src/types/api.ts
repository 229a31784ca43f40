/** Shapes of the API's responses, as the client reads them. */
import type { AppRule } from '@domain/abilities';
import type { Role } from '@domain/roles';
import type { TenantState } from '@domain/tenant-states';

export interface ApiUser {
  id: string;
  tenantId: string | null;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  deactivatedAt: string | null;
  lastSignInAt: string | null;
  createdAt: string;
}

export interface ApiFirm {
  id: string;
  name: string;
  shortName: string;
  accentColor: string;
  accentColorReadable: string;
  logoUrl: string | null;
  monitoringCenterName: string;
  monitoringCenterPhone: string;
  timeZone: string;
  licenceNumber?: string;
  state?: TenantState;
  planKey?: string | null;
  trialEndsAt?: string | null;
  trialDaysLeft?: number | null;
  createdAt?: string;
}

export interface SessionInfo {
  user: ApiUser | null;
  tenant: ApiFirm | null;
  rules: AppRule[];
  csrfToken: string;
}

export interface Page {
  number: number;
  size: number;
  total: number;
}

export interface ListResponse<T> {
  data: T[];
  page: Page;
}

export interface ApiInvitation {
  id: string;
  email: string;
  role: Role;
  state: 'pending' | 'expired' | 'accepted' | 'revoked';
  expiresAt: string;
  sentAt: string | null;
  createdAt: string;
}

export interface InvitationPreview {
  firm: { name: string; accentColor: string };
  email: string;
  role: Role;
  roleLabel: string;
  expiresAt: string;
}

export interface OperatorTenant {
  id: string;
  name: string;
  shortName: string;
  state: TenantState;
  planKey: string | null;
  staffCount: number;
  trialEndsAt: string | null;
  suspendedAt: string | null;
  suspendedReason: string | null;
  createdAt: string;
}

export interface OperatorTenantDetail extends OperatorTenant {
  owner: { name: string; email: string } | null;
  actions: { id: string; action: string; at: string; by: string; reason: string | null }[];
}
