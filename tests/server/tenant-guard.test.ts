import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op, type WhereOptions } from 'sequelize';
import { AuditEvent } from '@server/models/AuditEvent';
import { Invitation } from '@server/models/Invitation';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import { TenantScopeError, hasTenantCondition } from '@server/models/base/tenant-guard';
import { createTestApp, type TestApp } from '../support/test-app';
import { buildFirmWithStaff } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithStaff>>;
let b: Awaited<ReturnType<typeof buildFirmWithStaff>>;
let invA: Invitation;
let invB: Invitation;

/** SQL sent to the database by one call, to prove a refused call sends none. */
function sqlLog() {
  const sent: string[] = [];
  return { sent, logging: (sql: string) => void sent.push(sql) };
}

const farFuture = () => new Date(Date.now() + 7 * 24 * 60 * 60 * 1000);

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithStaff();
  b = await buildFirmWithStaff();
  invA = await Invitation.create({ tenantId: a.firm.id, email: 'guard-a@test.example', role: 'technician', tokenHash: 'a'.repeat(64), invitedById: null, expiresAt: farFuture() });
  invB = await Invitation.create({ tenantId: b.firm.id, email: 'guard-b@test.example', role: 'technician', tokenHash: 'b'.repeat(64), invitedById: null, expiresAt: farFuture() });
});
afterAll(async () => {
  await t.close();
});

describe('refuses unscoped queries on firm-owned models before any SQL is sent', () => {
  it('User.findAll({}) and User.findAll() throw TenantScopeError', async () => {
    const log = sqlLog();
    await expect(User.findAll({ logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(User.findAll({ where: {}, logging: log.logging })).rejects.toThrow(/unscoped find on User/);
    expect(log.sent).toEqual([]);
  });

  it('Invitation.findOne({ where: { id } }) and findByPk throw', async () => {
    const log = sqlLog();
    await expect(Invitation.findOne({ where: { id: invB.id }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(Invitation.findByPk(invB.id, { logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(User.findOne({ where: { email: b.owner.email }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    expect(log.sent).toEqual([]);
  });

  it('count without tenantId throws, and so does findAndCountAll', async () => {
    const log = sqlLog();
    await expect(User.count({ logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(Invitation.count({ where: { role: 'technician' }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(User.findAndCountAll({ where: { role: 'owner' }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    expect(log.sent).toEqual([]);
  });

  it('a bulk update without tenantId throws and changes nothing', async () => {
    const log = sqlLog();
    await expect(User.update({ name: 'Everyone' }, { where: { role: 'technician' }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(Invitation.update({ revokedAt: new Date() }, { where: { id: invB.id }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    expect(log.sent).toEqual([]);
    const tech = await User.findOne({ where: { tenantId: b.firm.id, id: b.technician.id } });
    expect(tech!.name).toBe(b.technician.name);
    const inv = await Invitation.findOne({ where: { tenantId: b.firm.id, id: invB.id } });
    expect(inv!.revokedAt).toBeNull();
  });

  it('a bulk destroy without tenantId throws and deletes nothing', async () => {
    const log = sqlLog();
    await expect(Invitation.destroy({ where: { id: invB.id }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(User.destroy({ where: { id: b.technician.id }, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    await expect(AuditEvent.destroy({ where: {}, logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    expect(log.sent).toEqual([]);
    expect(await Invitation.count({ where: { tenantId: b.firm.id } })).toBe(1);
    expect(await User.count({ where: { tenantId: b.firm.id } })).toBe(3);
  });

  it('conditions that do not pin a firm are refused: null, empty, OR, a non-equality', async () => {
    const refused: WhereOptions[] = [
      { tenantId: null },
      { tenantId: '' },
      { tenantId: { [Op.ne]: a.firm.id } },
      { tenantId: { [Op.in]: [] } },
      { tenantId: { [Op.like]: '%' } },
      { [Op.or]: [{ tenantId: a.firm.id }, { id: b.owner.id }] },
      { [Op.not]: { tenantId: a.firm.id } },
    ];
    for (const where of refused) {
      expect(hasTenantCondition(where)).toBe(false);
      await expect(User.findAll({ where })).rejects.toBeInstanceOf(TenantScopeError);
    }
  });

  it('an include of a guarded model without a tenant condition throws', async () => {
    const log = sqlLog();
    await expect(Tenant.findAll({ where: { id: a.firm.id }, include: [{ model: User, as: 'users' }], logging: log.logging })).rejects.toBeInstanceOf(
      TenantScopeError,
    );
    await expect(Tenant.findOne({ where: { id: a.firm.id }, include: [{ model: Invitation, as: 'invitations' }], logging: log.logging })).rejects.toThrow(
      /include in find on Invitation/,
    );
    await expect(Tenant.count({ include: [{ model: User, as: 'users' }], logging: log.logging })).rejects.toBeInstanceOf(TenantScopeError);
    // nested below a scoped query, still refused
    await expect(
      User.findAll({
        where: { tenantId: a.firm.id },
        include: [{ model: Tenant, as: 'tenant', include: [{ model: Invitation, as: 'invitations' }] }],
        logging: log.logging,
      }),
    ).rejects.toBeInstanceOf(TenantScopeError);
    // the firm named on the outer query does not cover the include
    await expect(
      Tenant.findAll({ where: { id: a.firm.id }, include: [{ model: User, as: 'users', where: { role: 'owner' } }], logging: log.logging }),
    ).rejects.toBeInstanceOf(TenantScopeError);
    expect(log.sent).toEqual([]);
  });
});

describe('lets scoped and deliberately cross-firm queries through', () => {
  it('find, count and findAndCountAll with tenantId return that firm’s rows only', async () => {
    const users = await User.findAll({ where: { tenantId: a.firm.id } });
    expect(users.map((u) => u.id).sort()).toEqual([a.owner.id, a.coordinator.id, a.technician.id].sort());
    expect(await User.count({ where: { tenantId: a.firm.id } })).toBe(3);
    const { rows, count } = await User.findAndCountAll({ where: { tenantId: { [Op.eq]: b.firm.id }, role: 'owner' } });
    expect(count).toBe(1);
    expect(rows[0]!.id).toBe(b.owner.id);
    const inv = await Invitation.findOne({ where: { id: invB.id, tenantId: a.firm.id } });
    expect(inv).toBeNull();
    const own = await Invitation.findOne({ where: { [Op.and]: [{ tenantId: a.firm.id }, { id: invA.id }] } });
    expect(own!.id).toBe(invA.id);
    const several = await User.findAll({ where: { tenantId: { [Op.in]: [a.firm.id, b.firm.id] }, role: 'owner' } });
    expect(several.map((u) => u.id).sort()).toEqual([a.owner.id, b.owner.id].sort());
  });

  it('bulk update and destroy with tenantId touch only that firm', async () => {
    const extraA = await Invitation.create({ tenantId: a.firm.id, email: 'guard-x@test.example', role: 'coordinator', tokenHash: 'c'.repeat(64), invitedById: null, expiresAt: farFuture() });
    const extraB = await Invitation.create({ tenantId: b.firm.id, email: 'guard-x@test.example', role: 'coordinator', tokenHash: 'd'.repeat(64), invitedById: null, expiresAt: farFuture() });
    const [updated] = await Invitation.update({ role: 'technician' }, { where: { tenantId: a.firm.id, email: 'guard-x@test.example' } });
    expect(updated).toBe(1);
    expect((await Invitation.findOne({ where: { tenantId: b.firm.id, id: extraB.id } }))!.role).toBe('coordinator');
    const destroyed = await Invitation.destroy({ where: { tenantId: a.firm.id, email: 'guard-x@test.example' } });
    expect(destroyed).toBe(1);
    expect(await Invitation.count({ where: { tenantId: a.firm.id, id: extraA.id } })).toBe(0);
    expect(await Invitation.count({ where: { tenantId: b.firm.id, id: extraB.id } })).toBe(1);
    await Invitation.destroy({ where: { tenantId: b.firm.id, id: extraB.id } });
  });

  it('an include that names the firm works', async () => {
    const firms = await Tenant.findAll({ where: { id: a.firm.id }, include: [{ model: User, as: 'users', where: { tenantId: a.firm.id } }] });
    expect(firms).toHaveLength(1);
    const users = (firms[0] as unknown as { users: User[] }).users;
    expect(users.map((u) => u.id).sort()).toEqual([a.owner.id, a.coordinator.id, a.technician.id].sort());
    // including the unguarded Tenant from a scoped query is fine
    const withFirm = await User.findOne({ where: { tenantId: a.firm.id, id: a.owner.id }, include: [{ model: Tenant, as: 'tenant' }] });
    expect(withFirm!.tenant!.id).toBe(a.firm.id);
  });

  it('crossTenant: true allows the same calls deliberately', async () => {
    const all = await User.findAll({ crossTenant: true });
    expect(all.length).toBeGreaterThanOrEqual(6);
    expect((await Invitation.findOne({ where: { id: invB.id }, crossTenant: true }))!.tenantId).toBe(b.firm.id);
    expect(await Invitation.count({ crossTenant: true })).toBeGreaterThanOrEqual(2);
    const firms = await Tenant.findAll({ where: { id: [a.firm.id, b.firm.id] }, include: [{ model: User, as: 'users' }], crossTenant: true });
    expect(firms).toHaveLength(2);
    const [n] = await User.update({ lastSignInAt: new Date() }, { where: { role: 'owner' }, crossTenant: true });
    expect(n).toBeGreaterThanOrEqual(2);
    const temp = await Invitation.create({ tenantId: b.firm.id, email: 'guard-tmp@test.example', role: 'technician', tokenHash: 'e'.repeat(64), invitedById: null, expiresAt: farFuture() });
    expect(await Invitation.destroy({ where: { id: temp.id }, crossTenant: true })).toBe(1);
  });

  it('the unguarded firms table itself is read by id', async () => {
    expect((await Tenant.findOne({ where: { id: b.firm.id } }))!.name).toBe(b.firm.name);
  });
});
