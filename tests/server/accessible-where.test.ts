/**
 * accessibleWhere (CASL rules → Sequelize where) is checked against ability.can row by row:
 * for each role and each action/subject, the rows the `where` selects from a database with
 * several firms must be exactly the rows the ability allows.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, type Model, type ModelStatic, type WhereOptions } from 'sequelize';
import { ACTIONS, abilityFor, createAbility, subject, type Action, type AppAbility, type AppRule, type SubjectType } from '@domain/abilities';
import type { Role } from '@domain/roles';
import { accessibleWhere, mongoToSequelize } from '@server/auth/accessible-where';
import { AuditEvent } from '@server/models/AuditEvent';
import { Invitation } from '@server/models/Invitation';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import { createTestApp, type TestApp } from '../support/test-app';
import { buildFirm, buildUser } from '../support/factories';

let t: TestApp;
let firms: Tenant[];
const actingUsers: Partial<Record<Role, User>> = {};

type Row = Model & { id: string; tenantId?: string | null };
const MODELS: Record<Extract<SubjectType, 'Tenant' | 'User' | 'Invitation' | 'AuditEvent'>, ModelStatic<Row>> = {
  Tenant,
  User,
  Invitation,
  AuditEvent,
};
type TableSubject = keyof typeof MODELS;
const TABLE_SUBJECTS = Object.keys(MODELS) as TableSubject[];

let tokenCounter = 0;
async function invitation(tenant: Tenant, role: Role, state: 'pending' | 'accepted' | 'revoked') {
  tokenCounter += 1;
  return Invitation.create({
    tenantId: tenant.id,
    email: `aw-${tokenCounter}@test.example`,
    role,
    tokenHash: tokenCounter.toString(16).padStart(64, '0'),
    invitedById: null,
    expiresAt: new Date(Date.now() + 86_400_000),
    acceptedAt: state === 'accepted' ? new Date() : null,
    revokedAt: state === 'revoked' ? new Date() : null,
  });
}

async function audit(tenantId: string | null, actorRole: string | null, action = 'test.event') {
  return AuditEvent.create({ tenantId, actorId: null, actorRole, action, subjectType: 'Tenant', subjectId: tenantId, details: null, ip: null });
}

beforeAll(async () => {
  t = await createTestApp();
  firms = [await buildFirm({ state: 'active' }), await buildFirm(), await buildFirm({ state: 'suspended' })];
  for (const firm of firms) {
    await buildUser(firm, 'owner');
    await buildUser(firm, 'coordinator');
    await buildUser(firm, 'technician');
    await buildUser(firm, 'technician', { deactivatedAt: new Date() });
    await buildUser(firm, 'client');
    await buildUser(firm, 'client');
    for (const role of ['client', 'technician', 'coordinator'] as const) {
      await invitation(firm, role, 'pending');
      await invitation(firm, role, 'accepted');
    }
    await invitation(firm, 'client', 'revoked');
    await audit(firm.id, 'owner');
    await audit(firm.id, 'operator', 'firm.suspended');
    await audit(firm.id, null, 'password.reset');
  }
  await buildUser(null, 'operator');
  await buildUser(null, 'operator');
  await audit(null, 'operator', 'operator.created');
  await audit(null, null, 'service.event');

  const home = firms[0]!;
  const people = await User.findAll({ where: { tenantId: home.id, deactivatedAt: null } });
  for (const role of ['owner', 'coordinator', 'technician', 'client'] as const) actingUsers[role] = people.find((p) => p.role === role)!;
  actingUsers.operator = (await User.findAll({ where: { role: 'operator' }, crossTenant: true }))[0]!;
});
afterAll(async () => {
  await t.close();
});

function abilityOf(role: Role): AppAbility {
  const u = actingUsers[role]!;
  return abilityFor({ id: u.id, role: u.role, tenantId: u.tenantId });
}

async function allRows(type: TableSubject): Promise<Row[]> {
  return MODELS[type].findAll({ crossTenant: true });
}

function allowedIds(ability: AppAbility, action: Action, type: TableSubject, rows: Row[]): string[] {
  return rows.filter((r) => ability.can(action, subject(type, r.get({ plain: true }) as Record<string, unknown>))).map((r) => r.id).sort();
}

async function selectedIds(type: TableSubject, where: WhereOptions, firmScope?: string): Promise<string[]> {
  const model = MODELS[type];
  if (firmScope === undefined) return (await model.findAll({ where, crossTenant: true })).map((r) => r.id).sort();
  const scope = type === 'Tenant' ? { id: firmScope } : { tenantId: firmScope };
  return (await model.findAll({ where: { [Op.and]: [scope, where] } })).map((r) => r.id).sort();
}

/** Compares the SQL selection with ability.can over every row; returns the allowed ids. */
async function expectSameRows(ability: AppAbility, action: Action, type: TableSubject, firmScope?: string): Promise<string[]> {
  const rows = await allRows(type);
  const inScope = firmScope === undefined ? rows : rows.filter((r) => (type === 'Tenant' ? r.id : r.tenantId) === firmScope);
  const expected = allowedIds(ability, action, type, inScope);
  const where = accessibleWhere(ability, action, type);
  if (where === null) {
    expect(expected, `${action} ${type}: no rule, yet ability allows rows`).toEqual([]);
    return expected;
  }
  expect(await selectedIds(type, where, firmScope), `${action} ${type}`).toEqual(expected);
  return expected;
}

describe('the product’s rules, role by role', () => {
  const firmRoles = ['owner', 'coordinator', 'technician', 'client'] as const;

  for (const role of firmRoles) {
    it(`${role}: every action on every table, with the firm scope and without it`, async () => {
      const ability = abilityOf(role);
      for (const type of TABLE_SUBJECTS) {
        for (const action of ACTIONS) {
          await expectSameRows(ability, action, type, firms[0]!.id);
          await expectSameRows(ability, action, type);
        }
      }
    });
  }

  it('operator: every action on every table (the console is cross-firm)', async () => {
    const ability = abilityOf('operator');
    for (const type of TABLE_SUBJECTS) for (const action of ACTIONS) await expectSameRows(ability, action, type);
  });

  it('selects what each role should see (the comparison is not vacuous)', async () => {
    const home = firms[0]!.id;
    const users = await allRows('User');
    const homeUsers = users.filter((u) => u.tenantId === home).map((u) => u.id).sort();
    expect(await expectSameRows(abilityOf('owner'), 'read', 'User')).toEqual(homeUsers);
    expect(await expectSameRows(abilityOf('technician'), 'read', 'User')).toEqual(homeUsers);
    expect(await expectSameRows(abilityOf('client'), 'read', 'User')).toEqual([actingUsers.client!.id]);
    expect(await expectSameRows(abilityOf('owner'), 'administer', 'User')).toEqual(homeUsers);

    const invitations = (await allRows('Invitation')) as unknown as Invitation[];
    const homeClientInvitations = invitations.filter((i) => i.tenantId === home && i.role === 'client').map((i) => i.id).sort();
    expect(homeClientInvitations.length).toBeGreaterThan(1);
    expect(await expectSameRows(abilityOf('coordinator'), 'update', 'Invitation')).toEqual(homeClientInvitations);
    expect(await expectSameRows(abilityOf('owner'), 'delete', 'Invitation')).toEqual(
      invitations.filter((i) => i.tenantId === home).map((i) => i.id).sort(),
    );

    const events = (await allRows('AuditEvent')) as unknown as AuditEvent[];
    expect(await expectSameRows(abilityOf('operator'), 'read', 'AuditEvent')).toEqual(
      events.filter((e) => e.actorRole === 'operator').map((e) => e.id).sort(),
    );
    expect(await expectSameRows(abilityOf('operator'), 'suspend', 'Tenant')).toEqual(firms.map((f) => f.id).sort());
    expect(await expectSameRows(abilityOf('coordinator'), 'read', 'Tenant')).toEqual([home]);
  });

  it('answers null where a role has no rule at all', () => {
    expect(accessibleWhere(abilityOf('operator'), 'read', 'User')).toBeNull();
    expect(accessibleWhere(abilityOf('operator'), 'read', 'Invitation')).toBeNull();
    expect(accessibleWhere(abilityOf('technician'), 'read', 'Invitation')).toBeNull();
    expect(accessibleWhere(abilityOf('technician'), 'administer', 'User')).toBeNull();
    expect(accessibleWhere(abilityOf('coordinator'), 'update', 'Tenant')).toBeNull();
    expect(accessibleWhere(abilityOf('client'), 'read', 'AuditEvent')).toBeNull();
    expect(accessibleWhere(abilityFor(null), 'read', 'Tenant')).toBeNull();
    // a firm role without a firm may do nothing
    expect(accessibleWhere(abilityFor({ id: actingUsers.owner!.id, role: 'owner', tenantId: null }), 'read', 'User')).toBeNull();
  });

  it('answers an empty condition (every row) for a rule without conditions', () => {
    expect(accessibleWhere(abilityOf('operator'), 'read', 'Tenant')).toEqual({});
  });
});

describe('custom rule lists, cannot rules included', () => {
  const A = () => firms[0]!.id;
  const B = () => firms[1]!.id;

  const cases: { name: string; type: TableSubject; rules: () => AppRule[] }[] = [
    {
      name: 'can in firm A, cannot clients',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User', conditions: { tenantId: A() } },
        { action: 'read', subject: 'User', inverted: true, conditions: { role: 'client' } },
      ],
    },
    {
      name: 'can everything, cannot firm B (rows without a firm stay allowed)',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User' },
        { action: 'read', subject: 'User', inverted: true, conditions: { tenantId: B() } },
      ],
    },
    {
      name: 'a cannot written before the can does not limit it',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User', inverted: true, conditions: { role: 'client' } },
        { action: 'read', subject: 'User', conditions: { tenantId: A() } },
      ],
    },
    {
      name: 'cannot with $in on a firm list',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User', conditions: { tenantId: { $in: [A(), B()] } } },
        { action: 'read', subject: 'User', inverted: true, conditions: { role: { $in: ['owner', 'coordinator'] } } },
      ],
    },
    {
      name: 'cannot with $nin',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User' },
        { action: 'read', subject: 'User', inverted: true, conditions: { role: { $nin: ['owner'] } } },
      ],
    },
    {
      name: 'cannot firm A with $eq',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User' },
        { action: 'read', subject: 'User', inverted: true, conditions: { tenantId: { $eq: A() } } },
      ],
    },
    {
      name: 'cannot with $ne on a column with nulls',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User' },
        { action: 'read', subject: 'User', inverted: true, conditions: { tenantId: { $ne: A() } } },
      ],
    },
    {
      name: 'can with $ne on a column with nulls',
      type: 'AuditEvent',
      rules: () => [{ action: 'read', subject: 'AuditEvent', conditions: { actorRole: { $ne: 'operator' } } }],
    },
    {
      name: 'can with $nin on a column with nulls',
      type: 'User',
      rules: () => [{ action: 'read', subject: 'User', conditions: { tenantId: { $nin: [A()] } } }],
    },
    {
      name: 'cannot on null (deactivated people hidden)',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User', conditions: { tenantId: A() } },
        { action: 'read', subject: 'User', inverted: true, conditions: { deactivatedAt: { $ne: null } } },
      ],
    },
    {
      name: 'cannot the accepted invitations of any firm',
      type: 'Invitation',
      rules: () => [
        { action: 'read', subject: 'Invitation' },
        { action: 'read', subject: 'Invitation', inverted: true, conditions: { acceptedAt: { $ne: null } } },
      ],
    },
    {
      name: 'cannot several fields at once (both must match to forbid)',
      type: 'Invitation',
      rules: () => [
        { action: 'read', subject: 'Invitation', conditions: { tenantId: { $in: [A(), B()] } } },
        { action: 'read', subject: 'Invitation', inverted: true, conditions: { tenantId: B(), role: 'technician' } },
      ],
    },
    {
      name: 'can, cannot, can: the later can wins over the cannot',
      type: 'User',
      rules: () => [
        { action: 'read', subject: 'User', conditions: { tenantId: A() } },
        { action: 'read', subject: 'User', inverted: true, conditions: { role: 'technician' } },
        { action: 'read', subject: 'User', conditions: { tenantId: B(), role: 'technician' } },
      ],
    },
    {
      name: 'two cannots bound one can',
      type: 'AuditEvent',
      rules: () => [
        { action: 'read', subject: 'AuditEvent' },
        { action: 'read', subject: 'AuditEvent', inverted: true, conditions: { tenantId: A() } },
        { action: 'read', subject: 'AuditEvent', inverted: true, conditions: { actorRole: 'operator' } },
      ],
    },
    {
      name: 'manage covers read; cannot read narrows it',
      type: 'Invitation',
      rules: () => [
        { action: 'manage', subject: 'Invitation', conditions: { tenantId: A() } },
        { action: 'read', subject: 'Invitation', inverted: true, conditions: { role: 'coordinator' } },
      ],
    },
  ];

  for (const c of cases) {
    it(c.name, async () => {
      const ability = createAbility(c.rules());
      const allowed = await expectSameRows(ability, 'read', c.type);
      const all = await allRows(c.type);
      // every case allows some rows and refuses some, so both directions are tested
      expect(allowed.length, 'allows some rows').toBeGreaterThan(0);
      expect(allowed.length, 'refuses some rows').toBeLessThan(all.length);
      // and within one firm, as the routes query
      await expectSameRows(ability, 'read', c.type, A());
      await expectSameRows(ability, 'read', c.type, B());
    });
  }

  it('an unconditional cannot after the can leaves nothing (null)', () => {
    const ability = createAbility([
      { action: 'read', subject: 'User', conditions: { tenantId: A() } },
      { action: 'read', subject: 'User', inverted: true },
    ]);
    expect(accessibleWhere(ability, 'read', 'User')).toBeNull();
  });

  it('an unconditional cannot before the can does not limit it', async () => {
    const ability = createAbility([
      { action: 'read', subject: 'User', inverted: true },
      { action: 'read', subject: 'User', conditions: { tenantId: A() } },
    ]);
    expect(await expectSameRows(ability, 'read', 'User')).toHaveLength(6);
  });

  it('only cannot rules allow nothing', () => {
    const ability = createAbility([{ action: 'read', subject: 'User', inverted: true, conditions: { role: 'client' } }]);
    expect(accessibleWhere(ability, 'read', 'User')).toBeNull();
  });

  it('refuses a condition operator it does not translate, instead of ignoring it', () => {
    expect(() => mongoToSequelize({ name: { $regex: '^A' } })).toThrow(/\$regex/);
    const ability = createAbility([{ action: 'read', subject: 'User', conditions: { name: { $regex: '^A' } } }]);
    expect(() => accessibleWhere(ability, 'read', 'User')).toThrow();
  });

  it('refuses a top-level $or or $and, which CASL does not read as logic', async () => {
    const rules: AppRule[] = [{ action: 'read', subject: 'User', conditions: { $or: [{ tenantId: A() }, { role: 'operator' }] } }];
    const ability = createAbility(rules);
    // ability.can allows none of these rows; a translation to SQL OR would select some
    const rows = await allRows('User');
    expect(allowedIds(ability, 'read', 'User', rows)).toEqual([]);
    expect(() => accessibleWhere(ability, 'read', 'User')).toThrow(/\$or/);
    expect(() => mongoToSequelize({ $and: [{ role: 'owner' }] })).toThrow(/\$and/);
  });

  it('translates a null condition to IS NULL and several operators on one field to AND', async () => {
    const ability = createAbility([{ action: 'read', subject: 'User', conditions: { tenantId: null, role: { $in: ['operator', 'owner'], $ne: 'owner' } } }]);
    const allowed = await expectSameRows(ability, 'read', 'User');
    expect(allowed).toHaveLength(2);
  });
});
