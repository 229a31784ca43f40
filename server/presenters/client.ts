import type { Client } from '../models/Client';

export type Audience = 'staff' | 'client';

/** The audience of a response: a homeowner gets the client audience, firm staff the staff one. */
export function audienceOf(user: { role: string } | null | undefined): Audience {
  return user?.role === 'client' ? 'client' : 'staff';
}

/**
 * A client record (api-resources.md, "Client"). `notes` are internal: staff only.
 * `siteCount` is added when the caller counted the client's sites.
 */
export function presentClient(client: Client, { audience, siteCount }: { audience: Audience; siteCount?: number }) {
  const base = {
    id: client.id,
    name: client.name,
    email: client.email,
    phone: client.phone,
    altPhone: client.altPhone,
    status: client.status,
    ...(siteCount !== undefined ? { siteCount } : {}),
    createdAt: client.createdAt.toISOString(),
    updatedAt: client.updatedAt.toISOString(),
  };
  if (audience === 'client') return base;
  return { ...base, notes: client.notes };
}
export type PresentedClient = ReturnType<typeof presentClient>;
