import type { Ctx } from '../context';
import { AuditEvent } from '../models/AuditEvent';

export interface AuditInput {
  action: string;
  subjectType: string;
  subjectId?: string | null;
  details?: Record<string, unknown>;
  /** the firm the event concerns; defaults to the actor's firm */
  tenantId?: string | null;
}

/** Writes one audit event in the caller's transaction. */
export async function recordAudit(ctx: Ctx, input: AuditInput): Promise<void> {
  await AuditEvent.create(
    {
      tenantId: input.tenantId !== undefined ? input.tenantId : ctx.tenantId,
      actorId: ctx.user?.id ?? null,
      actorRole: ctx.user?.role ?? null,
      action: input.action,
      subjectType: input.subjectType,
      subjectId: input.subjectId ?? null,
      details: input.details ?? null,
      ip: ctx.ip ?? null,
    },
    { transaction: ctx.transaction },
  );
}
