/**
 * The invented demo scenario: two fictional firms in a fictional county, staff of each
 * role, and one service operator. Names, addresses and e-mails are invented (.example
 * domains are reserved for examples).
 */
import type { Sequelize } from 'sequelize';
import { trialEndsAt } from '@domain/tenant-states';
import { hashPassword } from '../../auth/passwords';
import type { SecretBox } from '../../crypto/secret-box';
import type { TenantFiles } from '../../storage/tenant-files';
import { seedInstalledBase } from './demo-installed-base';
import { drawEmblem } from './plan-image';
import { seedFirmSubscriptionHistory, seedOtherSubscribers } from './demo-subscriptions';
import { AuditEvent } from '../../models/AuditEvent';
import { Tenant } from '../../models/Tenant';
import { User } from '../../models/User';

export const DEMO_PASSWORD = 'mullion-demo-2026';

export interface DemoSignIn {
  email: string;
  role: string;
  firm: string | null;
}

const FIRMS = [
  {
    name: 'Lanternfield Alarm Co.',
    shortName: 'lanternfield',
    domain: 'lanternfield.example',
    seed: 11,
    region: 'Brindle County',
    state: 'active' as const,
    timeZone: 'America/Chicago',
    licenceNumber: 'AL-20417',
    monitoringCenterName: 'Brindle County Monitoring',
    phone: '+1 555 010 4100',
    monitoringCenterPhone: '+1 555 010 4400',
    accentColor: '#2f5d7c',
    emblem: 'lantern' as const,
    staff: [
      { name: 'Ada Kestrel', role: 'owner' as const, local: 'ada' },
      { name: 'Marek Oduya', role: 'coordinator' as const, local: 'marek' },
      { name: 'Priya Hollins', role: 'technician' as const, local: 'priya' },
      { name: 'Tom Wexley', role: 'technician' as const, local: 'tom' },
    ],
  },
  {
    name: 'Tamsworth Vale Security',
    shortName: 'tamsworth-vale',
    domain: 'tamsworthvale.example',
    seed: 29,
    region: 'Vale County',
    state: 'trialing' as const,
    timeZone: 'America/Denver',
    licenceNumber: 'SV-3381',
    monitoringCenterName: 'Vale Watch Center',
    phone: '+1 555 010 7700',
    monitoringCenterPhone: '+1 555 010 7788',
    accentColor: '#6b3f7a',
    emblem: 'vale' as const,
    staff: [
      { name: 'Gwen Tamsin', role: 'owner' as const, local: 'gwen' },
      { name: 'Luis Ferrant', role: 'coordinator' as const, local: 'luis' },
      { name: 'Noor Haddad', role: 'technician' as const, local: 'noor' },
    ],
  },
];

export const OPERATOR_EMAIL = 'operator@mullion.example';

export async function isDatabaseEmpty(): Promise<boolean> {
  return (await User.count({ crossTenant: true })) === 0;
}

export async function seedDemo(sequelize: Sequelize, { secrets, files, now = new Date() }: { secrets: SecretBox; files: TenantFiles; now?: Date }): Promise<DemoSignIn[]> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const signIns: DemoSignIn[] = [];
  await sequelize.transaction(async (transaction) => {
    const operator = await User.create(
      { tenantId: null, email: OPERATOR_EMAIL, name: 'Mullion Operator', role: 'operator', passwordHash },
      { transaction },
    );
    signIns.push({ email: operator.email, role: 'operator', firm: null });
    for (const firm of FIRMS) {
      const created = new Date(now.getTime() - (firm.state === 'active' ? 120 : 5) * 24 * 3600 * 1000);
      const tenant = await Tenant.create(
        {
          name: firm.name,
          shortName: firm.shortName,
          state: firm.state,
          planKey: firm.state === 'active' ? 'crew' : null,
          trialEndsAt: trialEndsAt(created),
          timeZone: firm.timeZone,
          licenceNumber: firm.licenceNumber,
          monitoringCenterName: firm.monitoringCenterName,
          phone: firm.phone,
          monitoringCenterPhone: firm.monitoringCenterPhone,
          accentColor: firm.accentColor,
          createdAt: created,
        },
        { transaction },
      );
      // the firm's logo, for its portal and the households' e-mails
      const logoFileId = await files.save(tenant.id, drawEmblem(firm.accentColor, firm.emblem), 'png');
      await tenant.update({ logoFileId, logoContentType: 'image/png' }, { transaction });
      const technicianIds: string[] = [];
      let coordinatorId: string | null = null;
      for (const person of firm.staff) {
        const user = await User.create(
          { tenantId: tenant.id, email: `${person.local}@${firm.domain}`, name: person.name, role: person.role, passwordHash },
          { transaction },
        );
        signIns.push({ email: user.email, role: person.role, firm: firm.name });
        if (person.role === 'technician') technicianIds.push(user.id);
        if (person.role === 'coordinator') coordinatorId = user.id;
      }
      const base = await seedInstalledBase(tenant.id, {
        seed: firm.seed,
        today: now,
        timeZone: firm.timeZone,
        region: firm.region,
        secrets,
        files,
        transaction,
        cp01FindingOnFirstPanel: true,
        technicianIds,
        coordinatorId,
      });
      if (base.firstClient) {
        // The first household signs in to the firm's portal (journey 2 of the demo).
        const home = await User.create(
          { tenantId: tenant.id, email: base.firstClient.email, name: base.firstClient.name, role: 'client', clientId: base.firstClient.id, passwordHash },
          { transaction },
        );
        signIns.push({ email: home.email, role: 'client', firm: firm.name });
      }
      await seedFirmSubscriptionHistory(tenant, {
        createdDaysAgo: firm.state === 'active' ? 120 : 5,
        state: firm.state,
        plan: firm.state === 'active' ? 'crew' : null,
        trialDays: 14,
        now,
        transaction,
      });
      await AuditEvent.create(
        { tenantId: tenant.id, actorId: null, actorRole: null, action: 'firm.created', subjectType: 'Tenant', subjectId: tenant.id, details: { demo: true }, ip: null },
        { transaction },
      );
    }
    await seedOtherSubscribers({ now, passwordHash, transaction });
  });
  return signIns;
}
