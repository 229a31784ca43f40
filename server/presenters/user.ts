import type { User } from '../models/User';

export function presentUser(user: User) {
  return {
    id: user.id,
    tenantId: user.tenantId,
    email: user.email,
    name: user.name,
    role: user.role,
    active: !user.deactivatedAt,
    deactivatedAt: user.deactivatedAt?.toISOString() ?? null,
    lastSignInAt: user.lastSignInAt?.toISOString() ?? null,
    createdAt: user.createdAt.toISOString(),
  };
}
export type PresentedUser = ReturnType<typeof presentUser>;
