/**
 * The ability matrix (product.md, "Who uses it (roles)"; architecture.md, "Authentication
 * and authorization"). Every role is checked against every action on every subject type,
 * in its own firm and in another firm. The expected outcome is written out below as an
 * explicit table: whatever a role's row does not list is forbidden, so changing a rule in
 * src/domain/abilities.ts makes a named case fail.
 */
import { describe, expect, it } from 'vitest';
import {
  ACTIONS,
  SUBJECTS,
  abilityFor,
  createAbility,
  defineRulesFor,
  subject,
  type AbilityUser,
  type Action,
  type SubjectType,
} from '@domain/abilities';
import { ROLES, type Role } from '@domain/roles';

const OWN_FIRM = '11111111-1111-4111-8111-111111111111';
const OTHER_FIRM = '22222222-2222-4222-8222-222222222222';
const ME = 'aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa';
const COLLEAGUE = 'bbbbbbbb-bbbb-4bbb-8bbb-bbbbbbbbbbbb';
const STRANGER = 'cccccccc-cccc-4ccc-8ccc-cccccccccccc';
const MY_CLIENT = 'dddddddd-dddd-4ddd-8ddd-dddddddddddd';
const OTHER_CLIENT = 'eeeeeeee-eeee-4eee-8eee-eeeeeeeeeeee';

/** The signed-in user for each role; the operator has no firm. */
function actor(role: Role): AbilityUser {
  return { id: ME, role, tenantId: role === 'operator' ? null : OWN_FIRM, clientId: role === 'client' ? MY_CLIENT : null };
}

/** The records each role is checked against: every subject type, own firm and other firm. */
const CASES = {
  'Tenant of own firm': { type: 'Tenant', record: () => ({ id: OWN_FIRM, name: 'Lanternfield Alarm Co.' }) },
  'Tenant of other firm': { type: 'Tenant', record: () => ({ id: OTHER_FIRM, name: 'Other Alarm Co.' }) },
  'User: own record': {
    type: 'User',
    record: (u: AbilityUser) => ({ id: u.id, tenantId: u.tenantId, role: u.role }),
  },
  'User: colleague in own firm': {
    type: 'User',
    record: () => ({ id: COLLEAGUE, tenantId: OWN_FIRM, role: 'technician' }),
  },
  'User of other firm': { type: 'User', record: () => ({ id: STRANGER, tenantId: OTHER_FIRM, role: 'technician' }) },
  'Invitation (client) of own firm': {
    type: 'Invitation',
    record: () => ({ id: 'inv-1', tenantId: OWN_FIRM, role: 'client' }),
  },
  'Invitation (coordinator) of own firm': {
    type: 'Invitation',
    record: () => ({ id: 'inv-2', tenantId: OWN_FIRM, role: 'coordinator' }),
  },
  'Invitation (technician) of own firm': {
    type: 'Invitation',
    record: () => ({ id: 'inv-3', tenantId: OWN_FIRM, role: 'technician' }),
  },
  'Invitation (client) of other firm': {
    type: 'Invitation',
    record: () => ({ id: 'inv-4', tenantId: OTHER_FIRM, role: 'client' }),
  },
  'Invitation (technician) of other firm': {
    type: 'Invitation',
    record: () => ({ id: 'inv-5', tenantId: OTHER_FIRM, role: 'technician' }),
  },
  'AuditEvent by staff of own firm': {
    type: 'AuditEvent',
    record: () => ({ id: 'ev-1', tenantId: OWN_FIRM, actorRole: 'owner', action: 'zone.updated' }),
  },
  'AuditEvent by operator on own firm': {
    type: 'AuditEvent',
    record: () => ({ id: 'ev-2', tenantId: OWN_FIRM, actorRole: 'operator', action: 'tenant.suspended' }),
  },
  'AuditEvent by staff of other firm': {
    type: 'AuditEvent',
    record: () => ({ id: 'ev-3', tenantId: OTHER_FIRM, actorRole: 'owner', action: 'zone.updated' }),
  },
  'AuditEvent by operator on other firm': {
    type: 'AuditEvent',
    record: () => ({ id: 'ev-4', tenantId: OTHER_FIRM, actorRole: 'operator', action: 'tenant.restored' }),
  },
  'Billing of own firm': { type: 'Billing', record: () => ({ tenantId: OWN_FIRM, plan: 'bench' }) },
  'Billing of other firm': { type: 'Billing', record: () => ({ tenantId: OTHER_FIRM, plan: 'crew' }) },
  OperatorConsole: { type: 'OperatorConsole', record: () => ({}) },
  'Client: the signed-in homeowner': { type: 'Client', record: () => ({ id: MY_CLIENT, tenantId: OWN_FIRM }) },
  'Client: another of own firm': { type: 'Client', record: () => ({ id: OTHER_CLIENT, tenantId: OWN_FIRM }) },
  'Client of other firm': { type: 'Client', record: () => ({ id: MY_CLIENT, tenantId: OTHER_FIRM }) },
  'Site of the signed-in homeowner': { type: 'Site', record: () => ({ id: 'site-1', clientId: MY_CLIENT, tenantId: OWN_FIRM }) },
  'Site of another client of own firm': { type: 'Site', record: () => ({ id: 'site-2', clientId: OTHER_CLIENT, tenantId: OWN_FIRM }) },
  'Site of other firm': { type: 'Site', record: () => ({ id: 'site-3', clientId: MY_CLIENT, tenantId: OTHER_FIRM }) },
  'Contact of own firm': { type: 'Contact', record: () => ({ id: 'c-1', siteId: 'site-1', tenantId: OWN_FIRM }) },
  'Contact of other firm': { type: 'Contact', record: () => ({ id: 'c-2', siteId: 'site-3', tenantId: OTHER_FIRM }) },
  'Document of own firm': { type: 'Document', record: () => ({ id: 'd-1', siteId: 'site-1', tenantId: OWN_FIRM, sharedWithClient: true }) },
  'Document of other firm': { type: 'Document', record: () => ({ id: 'd-2', siteId: 'site-3', tenantId: OTHER_FIRM, sharedWithClient: true }) },
  'Panel of own firm': { type: 'Panel', record: () => ({ id: 'p-1', siteId: 'site-1', tenantId: OWN_FIRM }) },
  'Panel of other firm': { type: 'Panel', record: () => ({ id: 'p-2', siteId: 'site-3', tenantId: OTHER_FIRM }) },
  'Zone of own firm': { type: 'Zone', record: () => ({ id: 'z-1', panelId: 'p-1', tenantId: OWN_FIRM }) },
  'Zone of other firm': { type: 'Zone', record: () => ({ id: 'z-2', panelId: 'p-2', tenantId: OTHER_FIRM }) },
  'Premises of own firm': { type: 'Premises', record: () => ({ id: 'f-1', siteId: 'site-1', tenantId: OWN_FIRM }) },
  'Premises of other firm': { type: 'Premises', record: () => ({ id: 'f-2', siteId: 'site-3', tenantId: OTHER_FIRM }) },
  'Job assigned to me': { type: 'Job', record: (u: AbilityUser) => ({ id: 'j-1', siteId: 'site-1', tenantId: OWN_FIRM, technicianId: u.id }) },
  'Job of a colleague': { type: 'Job', record: () => ({ id: 'j-2', siteId: 'site-1', tenantId: OWN_FIRM, technicianId: COLLEAGUE }) },
  'Job of other firm': { type: 'Job', record: (u: AbilityUser) => ({ id: 'j-3', siteId: 'site-3', tenantId: OTHER_FIRM, technicianId: u.id }) },
} satisfies Record<string, { type: SubjectType; record: (u: AbilityUser) => Record<string, unknown> }>;

type CaseName = keyof typeof CASES;
const CASE_NAMES = Object.keys(CASES) as CaseName[];

/** Every action, for rows where CASL's `manage` (any action) is granted. */
const ALL: readonly Action[] = ACTIONS;

/** What each role may do; anything not listed is forbidden. */
const MATRIX: Record<Role, Partial<Record<CaseName, readonly Action[]>>> = {
  operator: {
    // Lists every firm and may suspend and restore any of them.
    'Tenant of own firm': ['read', 'suspend', 'restore'],
    'Tenant of other firm': ['read', 'suspend', 'restore'],
    // Sees the service's own actions on a firm, never the firm's.
    'AuditEvent by operator on own firm': ['read'],
    'AuditEvent by operator on other firm': ['read'],
    OperatorConsole: ['read'],
    // No User, Invitation or Billing of any firm.
  },
  owner: {
    'Tenant of own firm': ['read', 'update'],
    'User: own record': ['read', 'administer'],
    'User: colleague in own firm': ['read', 'administer'],
    'Invitation (client) of own firm': ALL,
    'Invitation (coordinator) of own firm': ALL,
    'Invitation (technician) of own firm': ALL,
    'AuditEvent by staff of own firm': ['read'],
    'AuditEvent by operator on own firm': ['read'],
    'Billing of own firm': ALL,
    'Client: the signed-in homeowner': ALL,
    'Client: another of own firm': ALL,
    'Site of the signed-in homeowner': ALL,
    'Site of another client of own firm': ALL,
    'Contact of own firm': ALL,
    'Document of own firm': ALL,
    'Panel of own firm': ALL,
    'Zone of own firm': ALL,
    'Premises of own firm': ALL,
    'Job assigned to me': ALL,
    'Job of a colleague': ALL,
  },
  coordinator: {
    'Tenant of own firm': ['read'],
    'User: own record': ['read'],
    'User: colleague in own firm': ['read'],
    // Invites clients (homeowners), never staff.
    'Invitation (client) of own firm': ['create', 'read', 'update', 'delete'],
    // The whole installed base of the firm; no billing, no staff roles.
    'Client: the signed-in homeowner': ALL,
    'Client: another of own firm': ALL,
    'Site of the signed-in homeowner': ALL,
    'Site of another client of own firm': ALL,
    'Contact of own firm': ALL,
    'Document of own firm': ALL,
    'Panel of own firm': ALL,
    'Zone of own firm': ALL,
    'Premises of own firm': ALL,
    'Job assigned to me': ALL,
    'Job of a colleague': ALL,
  },
  technician: {
    'Tenant of own firm': ['read'],
    'User: own record': ['read'],
    'User: colleague in own firm': ['read'],
    // Reads every client and site (and may reveal the passcode on site); uploads documents;
    // edits panels and zones.
    'Client: the signed-in homeowner': ['read'],
    'Client: another of own firm': ['read'],
    'Site of the signed-in homeowner': ['read', 'reveal'],
    'Site of another client of own firm': ['read', 'reveal'],
    'Contact of own firm': ['read'],
    'Document of own firm': ['read', 'create'],
    'Panel of own firm': ALL,
    'Zone of own firm': ALL,
    'Premises of own firm': ALL,
    // Reads every job of the firm; changes only their own.
    'Job assigned to me': ['read', 'update'],
    'Job of a colleague': ['read'],
  },
  client: {
    'Tenant of own firm': ['read'],
    'User: own record': ['read'],
    // Only their own client record and sites, read-only (portal presenters hide staff fields).
    'Client: the signed-in homeowner': ['read'],
    'Site of the signed-in homeowner': ['read'],
  },
};

describe('the ability matrix covers the whole domain', () => {
  it('checks every subject type the rules know', () => {
    const covered = new Set(CASE_NAMES.map((name) => CASES[name].type));
    expect([...covered].sort()).toEqual([...SUBJECTS].sort());
  });

  it('has a row for every role', () => {
    expect(Object.keys(MATRIX).sort()).toEqual([...ROLES].sort());
  });
});

describe.each(ROLES.map((role) => [role]))('%s', (role) => {
  const user = actor(role);
  const ability = abilityFor(user);
  const row = MATRIX[role];

  for (const name of CASE_NAMES) {
    const { type, record } = CASES[name];
    const allowed = row[name] ?? [];
    for (const action of ACTIONS) {
      const expected = allowed.includes(action);
      it(`${expected ? 'may' : 'may not'} ${action} ${name}`, () => {
        expect(ability.can(action, subject(type, record(user)))).toBe(expected);
      });
    }
  }
});

describe('nobody without a firm, or signed out, may do anything', () => {
  const nobodies: [string, AbilityUser | null][] = [
    ['a signed-out visitor (null user)', null],
    ...ROLES.filter((r) => r !== 'operator').map(
      (role): [string, AbilityUser] => [`a ${role} with no firm (tenantId null)`, { id: ME, role, tenantId: null }],
    ),
  ];

  describe.each(nobodies)('%s', (_label, user) => {
    it('gets no rules at all', () => {
      expect(defineRulesFor(user)).toEqual([]);
    });

    const ability = abilityFor(user);
    for (const name of CASE_NAMES) {
      const { type, record } = CASES[name];
      it(`may do nothing to ${name}`, () => {
        const self = user ?? { id: ME, role: 'client' as const, tenantId: null };
        for (const action of ACTIONS) {
          expect(ability.can(action, subject(type, record(self))), `${action} ${name}`).toBe(false);
          expect(ability.can(action, type), `${action} any ${type}`).toBe(false);
        }
      });
    }
  });
});

describe('rules read as the product describes them', () => {
  it('owner may read and update own Tenant but not another firm\'s', () => {
    const owner = abilityFor(actor('owner'));
    expect(owner.can('read', subject('Tenant', { id: OWN_FIRM }))).toBe(true);
    expect(owner.can('update', subject('Tenant', { id: OWN_FIRM }))).toBe(true);
    expect(owner.can('read', subject('Tenant', { id: OTHER_FIRM }))).toBe(false);
    expect(owner.can('update', subject('Tenant', { id: OTHER_FIRM }))).toBe(false);
  });

  it('owner may not suspend their own firm (only the operator suspends)', () => {
    const owner = abilityFor(actor('owner'));
    expect(owner.can('suspend', subject('Tenant', { id: OWN_FIRM }))).toBe(false);
    expect(owner.can('restore', subject('Tenant', { id: OWN_FIRM }))).toBe(false);
  });

  it('coordinator and technician have no billing and cannot administer staff', () => {
    for (const role of ['coordinator', 'technician'] as const) {
      const ability = abilityFor(actor(role));
      expect(ability.can('read', 'Billing'), role).toBe(false);
      expect(ability.can('administer', 'User'), role).toBe(false);
      expect(ability.can('update', subject('Tenant', { id: OWN_FIRM })), role).toBe(false);
    }
  });

  it('coordinator may create an invitation only for role client', () => {
    const coordinator = abilityFor(actor('coordinator'));
    const invite = (role: string) => subject('Invitation', { tenantId: OWN_FIRM, role });
    expect(coordinator.can('create', invite('client'))).toBe(true);
    expect(coordinator.can('create', invite('coordinator'))).toBe(false);
    expect(coordinator.can('create', invite('technician'))).toBe(false);
    expect(coordinator.can('create', invite('owner'))).toBe(false);
  });

  it('a user whose firm changes gets rules for the new firm only', () => {
    const moved = abilityFor({ id: ME, role: 'owner', tenantId: OTHER_FIRM });
    expect(moved.can('read', subject('Tenant', { id: OTHER_FIRM }))).toBe(true);
    expect(moved.can('read', subject('Tenant', { id: OWN_FIRM }))).toBe(false);
  });

  it('the operator console is for the operator alone', () => {
    for (const role of ROLES) {
      expect(abilityFor(actor(role)).can('read', 'OperatorConsole'), role).toBe(role === 'operator');
    }
  });

  it('rules sent as JSON (GET /api/session) give the client the same answers', () => {
    for (const role of ROLES) {
      const user = actor(role);
      const fromJson = createAbility(JSON.parse(JSON.stringify(defineRulesFor(user))));
      const direct = abilityFor(user);
      for (const name of CASE_NAMES) {
        const { type, record } = CASES[name];
        for (const action of ACTIONS) {
          const s = subject(type, record(user));
          expect(fromJson.can(action, s), `${role} ${action} ${name}`).toBe(direct.can(action, s));
        }
      }
    }
  });
});
