/**
 * The e-mails Mullion sends, as plain text and simple HTML. Wording follows our voice:
 * plain, calm, says what to do next.
 */
import type { ContactSnapshot } from '@domain/contact-changes';
import { formatPhone } from '@domain/phone';
import { ROLE_LABELS, type Role } from '@domain/roles';
import type { FirmBrand } from './firm-brand';
import type { MailMessage } from './mailer';

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);
}

/** A paragraph is one line of text, or several lines kept together (a list). */
function layout(title: string, paragraphs: (string | string[])[], action: { label: string; href: string } | null, footer: string): string {
  const body = paragraphs
    .map((p) => `<p style="margin:0 0 14px;line-height:1.5">${(Array.isArray(p) ? p : [p]).map(escapeHtml).join('<br>')}</p>`)
    .join('');
  return `<!doctype html><html><body style="margin:0;background:#f6f4ef;font-family:'IBM Plex Sans',Arial,sans-serif;color:#1d2a30">
<div style="max-width:560px;margin:0 auto;padding:24px">
<div style="font-weight:600;font-size:18px;margin-bottom:16px">Mullion</div>
<div style="background:#ffffff;border:1px solid #d9d4c8;border-radius:6px;padding:24px">
<h1 style="font-size:20px;margin:0 0 16px">${escapeHtml(title)}</h1>
${body}
${
  action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(action.href)}" style="background:#8f5c17;color:#ffffff;padding:10px 16px;border-radius:6px;text-decoration:none;display:inline-block">${escapeHtml(action.label)}</a></p>
<p style="margin:0;font-size:13px;color:#5d6b73">If the button does not work, open this address: ${escapeHtml(action.href)}</p>`
    : ''
}
</div>
<p style="font-size:13px;color:#5d6b73;margin-top:16px">${escapeHtml(footer)}</p>
</div></body></html>`;
}

export function invitationEmail(input: {
  to: string;
  firmName: string;
  inviterName: string;
  role: Role;
  link: string;
  expiresAt: Date;
}): MailMessage {
  const role = ROLE_LABELS[input.role].toLowerCase();
  const subject = `${input.firmName} invited you to Mullion`;
  const expires = input.expiresAt.toUTCString().replace(/:\d\d GMT$/, ' UTC');
  const lines = [
    `${input.inviterName} at ${input.firmName} invited you to join their Mullion workspace as ${role}.`,
    `Open the link, choose your name and a password, and you are in. The link works once and expires ${expires}.`,
  ];
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\nAccept the invitation: ${input.link}\n\nNot expecting this? Ignore this e-mail; nothing happens without you.\n`,
    html: layout(subject, lines, { label: 'Accept the invitation', href: input.link }, 'Not expecting this? Ignore this e-mail; nothing happens without you.'),
  };
}

/**
 * A homeowner's invitation to their alarm firm's portal: the firm's name, logo and colour,
 * not Mullion's — the household knows the firm, not us.
 */
export function portalInvitationEmail(input: { to: string; firm: FirmBrand; link: string; expiresAt: Date }): MailMessage {
  const { firm } = input;
  const subject = `${firm.name} invites you to see your home's alarm online`;
  const expires = input.expiresAt.toUTCString().replace(/:\d\d GMT$/, ' UTC');
  const lines = [
    `${firm.name} looks after the alarm system in your home. In their client portal you can see which doors and windows are protected, what each device is called, when batteries are due, and what was done at every visit. You can also ask for a service visit and keep your emergency contacts up to date.`,
    `Open the link and choose a password. The link works once and expires ${expires}.`,
  ];
  const footer = `Not expecting this? Ignore this e-mail; nothing happens without you.${firm.phone ? ` Questions? Call ${firm.name} on ${firm.phone}.` : ''}`;
  return branded(firm, {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\nOpen my portal: ${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Open my portal', href: input.link }, footer),
  });
}

/** Puts the firm's name, logo and colour where Mullion's name and colour are. */
function branded(firm: FirmBrand, message: MailMessage): MailMessage {
  const extension = firm.logo?.contentType === 'image/png' ? 'png' : firm.logo?.contentType === 'image/webp' ? 'webp' : 'jpg';
  const accent = /^#[0-9a-f]{6}$/i.test(firm.accent) ? firm.accent : '#8f5c17';
  const header = `<div style="display:flex;align-items:center;gap:12px;background:${accent};color:#ffffff;border-radius:6px;padding:12px 16px;margin-bottom:16px">${
    firm.logo ? '<img src="cid:firm-logo" alt="" width="40" height="40" style="background:#ffffff;border-radius:6px;object-fit:contain;padding:2px;margin-right:12px;vertical-align:middle">' : ''
  }<span style="font-weight:600;font-size:18px;vertical-align:middle">${escapeHtml(firm.name)}</span></div>`;
  const html = message.html
    .replace('<div style="font-weight:600;font-size:18px;margin-bottom:16px">Mullion</div>', header)
    .replace('background:#8f5c17;', `background:${accent};`);
  return {
    ...message,
    html,
    ...(firm.logo ? { attachments: [{ filename: `logo.${extension}`, content: firm.logo.content, contentType: firm.logo.contentType, cid: 'firm-logo' }] } : {}),
  };
}

/** A household's reset (`firm` given) comes from its firm's portal, in the firm's colours. */
export function passwordResetEmail(input: { to: string; name: string; link: string; minutes: number; firm?: FirmBrand }): MailMessage {
  const { firm } = input;
  const subject = firm ? `Reset your password for ${firm.name}'s client portal` : 'Reset your Mullion password';
  const lines = [
    `Hello ${input.name},`,
    firm
      ? `Someone asked to reset the password you use for ${firm.name}'s client portal. If it was you, choose a new password within ${input.minutes} minutes; the link works once.`
      : `Someone asked to reset the password of this Mullion sign-in. If it was you, choose a new password within ${input.minutes} minutes; the link works once.`,
  ];
  const footer = `If it was not you, ignore this e-mail: your password stays as it is.${firm?.phone ? ` Questions? Call ${firm.name} on ${firm.phone}.` : ''}`;
  const message: MailMessage = {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\nChoose a new password: ${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Choose a new password', href: input.link }, footer),
  };
  return firm ? branded(firm, message) : message;
}

/** Sent to a new address after sign-up: the link that confirms it and starts the firm's trial. */
export function signUpConfirmationEmail(input: { to: string; name: string; firmName: string; link: string; hours: number; trialDays: number }): MailMessage {
  const subject = `Finish setting up ${input.firmName} on Mullion`;
  const lines = [
    `Hello ${input.name},`,
    `Confirm this address to start ${input.firmName}'s ${input.trialDays}-day trial. You will be signed in as the firm's owner with the password you chose, and can invite your office and technicians straight away.`,
    `The link works once and expires in ${input.hours} hours.`,
  ];
  const footer = 'Not expecting this? Ignore this e-mail; no firm is set up without you.';
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\nFinish setting up my firm: ${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Finish setting up my firm', href: input.link }, footer),
  };
}

/**
 * Sent instead of a confirmation when someone signs up with an address that already has a
 * Mullion sign-in: only the address's owner learns that, never the person on the sign-up page.
 */
export function signUpAccountExistsEmail(input: { to: string; name: string; signInLink: string; resetLink: string }): MailMessage {
  const subject = 'You already have a Mullion sign-in';
  const lines = [
    `Hello ${input.name},`,
    'Someone, probably you, asked to start a new firm on Mullion with this address. This address already has a Mullion sign-in, and one address is one sign-in, so no new firm was set up.',
    `Sign in: ${input.signInLink}`,
    `Forgotten your password? Choose a new one: ${input.resetLink}`,
    'To start a separate firm, sign up again with another address.',
  ];
  const footer = 'If it was not you, ignore this e-mail: nothing has changed.';
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Sign in', href: input.signInLink }, footer),
  };
}

/**
 * The completion report of a job, e-mailed to the client with the PDF attached: what was
 * done, when, and who to call. Only client-visible facts (never internal notes).
 */
export function jobCompletionEmail(input: {
  to: string;
  firmName: string;
  siteName: string;
  jobKindLabel: string;
  summary: string;
  completedOn: string;
  technicianName: string | null;
  report: { filename: string; content: Buffer };
}): MailMessage {
  const subject = `${input.jobKindLabel} at ${input.siteName} is complete`;
  const lines = [
    `${input.firmName} completed the visit at ${input.siteName} on ${input.completedOn}${input.technicianName ? `; ${input.technicianName} did the work` : ''}.`,
    `Work done: ${input.summary}`,
    'The completion report is attached as a PDF: the work done, parts, the checklist and the result of testing each zone with the monitoring center. Keep it with your alarm papers.',
  ];
  const footer = `Questions about this visit? Contact ${input.firmName}; they keep the report with your site’s service history.`;
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${footer}\n`,
    html: layout(subject, lines, null, footer),
    attachments: [{ filename: input.report.filename, content: input.report.content, contentType: 'application/pdf' }],
  };
}

/** "1. Lena Quill (Daughter), +1 555 010 4402, other phone +1 555 010 4403" */
function contactLines(contacts: ContactSnapshot[]): string[] {
  if (contacts.length === 0) return ['(nobody)'];
  return contacts.map((c, i) => {
    const relation = c.relation ? ` (${c.relation})` : '';
    const other = c.altPhone ? `, other phone ${formatPhone(c.altPhone)}` : '';
    return `${i + 1}. ${c.name}${relation}, ${formatPhone(c.phone)}${other}`;
  });
}

/**
 * Tells the firm's owner and coordinators that a household changed its emergency contacts
 * in the portal: what changed, the list before and now, and that the change must be
 * confirmed with the monitoring center (Mullion does not pass it on).
 */
export function householdContactsChangedEmail(input: {
  to: string;
  householdName: string;
  siteName: string;
  summary: string;
  before: ContactSnapshot[];
  after: ContactSnapshot[];
  monitoringCenterName: string;
  monitoringCenterPhone: string;
  link: string;
}): MailMessage {
  const subject = `${input.householdName} changed their emergency contacts`;
  const center = [input.monitoringCenterName, input.monitoringCenterPhone ? formatPhone(input.monitoringCenterPhone) : ''].filter(Boolean).join(', ');
  const intro = `${input.householdName} changed the emergency contacts of ${input.siteName} in your client portal. ${input.summary}.`;
  const before = ['Before, in calling order:', ...contactLines(input.before)];
  const after = ['Now, in calling order:', ...contactLines(input.after)];
  const reminder = `Confirm the new list with the monitoring center${center ? ` (${center})` : ''}: Mullion does not pass the change on, and the household was told that you confirm changes with them.`;
  const footer = 'You get this e-mail as the firm’s owner or a coordinator. The site page shows every change to its contacts.';
  return {
    to: input.to,
    subject,
    text: `${[intro, before.join('\n'), after.join('\n'), reminder].join('\n\n')}\n\nOpen the site: ${input.link}\n\n${footer}\n`,
    html: layout(subject, [intro, before, after, reminder], { label: 'Open the site', href: input.link }, footer),
  };
}
