/**
 * Who may do what, written once (architecture.md, "Authentication and authorization").
 * The server checks these rules on every route and turns them into `where` clauses for
 * lists; the client receives the same rules from GET /api/session to shape the UI.
 *
 * Every firm-scoped rule carries the user's own firm in its conditions, so another firm's
 * record never matches.
 */
import {
  AbilityBuilder,
  createMongoAbility,
  subject as caslSubject,
  type MongoAbility,
  type RawRuleOf,
} from '@casl/ability';
import type { Role } from './roles';

export const ACTIONS = [
  'manage',
  'read',
  'create',
  'update',
  'delete',
  'administer',
  'suspend',
  'restore',
  'reveal',
] as const;
export type Action = (typeof ACTIONS)[number];

export const SUBJECTS = [
  'Tenant',
  'User',
  'Invitation',
  'AuditEvent',
  'Billing',
  'OperatorConsole',
  'Client',
  'Site',
  'Contact',
  'Document',
  'Panel',
  'Zone',
  'Premises',
  'Job',
] as const;
export type SubjectType = (typeof SUBJECTS)[number];

export type AppAbility = MongoAbility<[Action, SubjectType | 'all' | TaggedSubject]>;
export type AppRule = RawRuleOf<AppAbility>;

/** A plain record tagged with its subject type (CASL's `subject()` helper). */
export type TaggedSubject = Record<string, unknown> & { __caslSubjectType__?: SubjectType };

export interface AbilityUser {
  id: string;
  role: Role;
  tenantId: string | null;
  clientId?: string | null;
}

export function defineRulesFor(user: AbilityUser | null): AppRule[] {
  const { can, rules } = new AbilityBuilder<AppAbility>(createMongoAbility);
  if (!user) return rules;

  if (user.role === 'operator') {
    can('read', 'OperatorConsole');
    can(['read', 'suspend', 'restore'], 'Tenant');
    // The operator sees the service's own actions on a firm, never the firm's records.
    can('read', 'AuditEvent', { actorRole: 'operator' });
    return rules;
  }

  const tenantId = user.tenantId;
  if (!tenantId) return rules; // a firm role without a firm may do nothing

  switch (user.role) {
    case 'owner':
      can(['read', 'update'], 'Tenant', { id: tenantId });
      can(['read', 'administer'], 'User', { tenantId });
      can('manage', 'Invitation', { tenantId });
      can('read', 'AuditEvent', { tenantId });
      can('manage', 'Billing', { tenantId });
      can('manage', ['Client', 'Site', 'Contact', 'Document', 'Panel', 'Zone', 'Premises', 'Job'], { tenantId });
      break;
    case 'coordinator':
      can('read', 'Tenant', { id: tenantId });
      can('read', 'User', { tenantId });
      // Coordinators invite clients (homeowners), never staff.
      can(['create', 'read', 'update', 'delete'], 'Invitation', { tenantId, role: 'client' });
      can('manage', ['Client', 'Site', 'Contact', 'Document', 'Panel', 'Zone', 'Premises', 'Job'], { tenantId });
      break;
    case 'technician':
      can('read', 'Tenant', { id: tenantId });
      can('read', 'User', { tenantId });
      // Technicians read every client and site, may see the passcode to verify with the
      // monitoring center on site, upload photos and documents, and edit panels and zones.
      can('read', ['Client', 'Site', 'Contact', 'Document'], { tenantId });
      can('reveal', 'Site', { tenantId });
      can('create', 'Document', { tenantId });
      can('manage', ['Panel', 'Zone', 'Premises'], { tenantId });
      // Every job of the firm is readable; only their own jobs are changeable (walk tests,
      // checklist, photos, start and completion).
      can('read', 'Job', { tenantId });
      can('update', 'Job', { tenantId, technicianId: user.id });
      break;
    case 'client':
      can('read', 'Tenant', { id: tenantId });
      can('read', 'User', { id: user.id, tenantId });
      // A homeowner reads their own client record and sites; portal routes present only
      // client-safe fields (no passcodes, access notes, internal notes or serials).
      if (user.clientId) {
        can('read', 'Client', { id: user.clientId, tenantId });
        can('read', 'Site', { clientId: user.clientId, tenantId });
      }
      break;
  }
  return rules;
}

export function createAbility(rules: AppRule[] = []): AppAbility {
  return createMongoAbility<AppAbility>(rules);
}

export function abilityFor(user: AbilityUser | null): AppAbility {
  return createAbility(defineRulesFor(user));
}

/** Tags a plain record with its subject type so conditions are checked against it. */
export function subject(type: SubjectType, record: Record<string, unknown>): TaggedSubject {
  return caslSubject(type, { ...record });
}
