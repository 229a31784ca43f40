/**
 * Factories that respect tenants: each builds its own firm unless given one, so tests
 * never share data and can run in parallel.
 */
import crypto from 'node:crypto';
import type { StaffRole } from '@domain/roles';
import type { TenantState } from '@domain/tenant-states';
import { trialEndsAt } from '@domain/tenant-states';
import { hashPassword } from '@server/auth/passwords';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';

export const TEST_PASSWORD = 'correct horse battery';
let passwordHash: Promise<string> | undefined;
const hashed = () => (passwordHash ??= hashPassword(TEST_PASSWORD));

const unique = () => crypto.randomUUID().slice(0, 8);

export async function buildFirm(overrides: Partial<{ name: string; state: TenantState }> = {}): Promise<Tenant> {
  const id = unique();
  return Tenant.create({
    name: overrides.name ?? `Test Firm ${id}`,
    shortName: `test-firm-${id}`,
    state: overrides.state ?? 'trialing',
    trialEndsAt: trialEndsAt(new Date()),
  });
}

export async function buildUser(
  tenant: Tenant | null,
  role: StaffRole | 'client' | 'operator',
  overrides: Partial<{ email: string; name: string; deactivatedAt: Date | null }> = {},
): Promise<User> {
  const id = unique();
  const user = await User.create({
    tenantId: tenant?.id ?? null,
    email: overrides.email ?? `${role}-${id}@test.example`,
    name: overrides.name ?? `Test ${role} ${id}`,
    role,
    passwordHash: await hashed(),
    deactivatedAt: overrides.deactivatedAt ?? null,
  });
  user.tenant = tenant;
  return user;
}

/** A firm with one person of each staff role. */
export async function buildFirmWithStaff(overrides: Partial<{ state: TenantState }> = {}) {
  const firm = await buildFirm(overrides);
  const [owner, coordinator, technician] = await Promise.all([
    buildUser(firm, 'owner'),
    buildUser(firm, 'coordinator'),
    buildUser(firm, 'technician'),
  ]);
  return { firm, owner: owner, coordinator: coordinator, technician: technician };
}
