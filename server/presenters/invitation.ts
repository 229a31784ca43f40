import type { Invitation } from '../models/Invitation';

export function presentInvitation(invitation: Invitation, now = new Date()) {
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    state: invitation.invitationState(now),
    expiresAt: invitation.expiresAt.toISOString(),
    sentAt: invitation.sentAt?.toISOString() ?? null,
    createdAt: invitation.createdAt.toISOString(),
  };
}
