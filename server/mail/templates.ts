/** The account e-mails, each in plain text and HTML with the same words. */
import type { Role } from '@shared/api/roles';
import type { MailMessage } from './mailer';
import { formatUtc } from '@shared/review/time-words';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

// the one date-time style of every screen, the brief and the report
const when = (d: Date) => formatUtc(d);

function html(paragraphs: string[], link: { href: string; label: string }): string {
  const ps = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('\n');
  return `<!doctype html>
<html><body style="font-family:Arial,Helvetica,sans-serif;font-size:16px;line-height:1.5;color:#0d1217;background:#f7f5ef;padding:16px">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border:1px solid #b9c0c7;border-radius:8px;padding:20px">
<p style="margin:0 0 14px;font-weight:bold;color:#0b2239">Brineline</p>
${ps}
<p style="margin:20px 0"><a href="${escapeHtml(link.href)}" style="display:inline-block;background:#0b2239;color:#f7f5ef;padding:12px 20px;border-radius:6px;text-decoration:none;font-weight:bold">${escapeHtml(link.label)}</a></p>
<p style="margin:0;font-size:13px;color:#3a4652">If the button does not work, copy this address into your browser:<br>${escapeHtml(link.href)}</p>
</div></body></html>`;
}

const article = (role: Role) => (role === 'admin' || role === 'engineer' ? 'an' : 'a');

export function invitationMail(m: {
  to: string;
  orgName: string;
  inviterName: string | null;
  role: Role;
  link: string;
  expiresAt: Date;
}): Omit<MailMessage, 'orgId'> {
  const who = m.inviterName ? `${m.inviterName} has invited you` : 'You have been invited';
  const lines = [
    `${who} to join ${m.orgName} on Brineline as ${article(m.role)} ${m.role}.`,
    'Brineline works out the loads that flood water and oil put on a damaged ship’s bulkheads, decks, hatches and patches, on deck and offline, and sends the survey ashore for review.',
    `Open the link to choose your name and password. It works once and expires on ${when(m.expiresAt)}.`,
    'If you did not expect this, ignore this message: nothing happens until the link is used.',
  ];
  return {
    to: m.to,
    subject: `Join ${m.orgName} on Brineline`,
    text: `${lines[0]}\n\n${lines[1]}\n\n${lines[2]}\n\n${m.link}\n\n${lines[3]}\n`,
    html: html(lines, { href: m.link, label: 'Accept the invitation' }),
  };
}

/**
 * To an address that already has an account with another organisation, instead of an invitation
 * link (one address belongs to one organisation). The inviting admin is answered exactly as for any
 * invitation; only the address's owner learns why no link came.
 */
export function invitationElsewhereMail(m: { to: string; orgName: string; inviterName: string | null; signInLink: string }): Omit<MailMessage, 'orgId'> {
  const who = m.inviterName ? `${m.inviterName} of ${m.orgName}` : `An administrator of ${m.orgName}`;
  const lines = [
    `${who} has invited this address to Brineline.`,
    'This address already has a Brineline account with another organisation, and one address can belong to one organisation only, so no invitation link is sent. Nothing has changed for your account.',
    `If you are to work with ${m.orgName}, ask them to invite another address of yours.`,
  ];
  return {
    to: m.to,
    subject: `About an invitation from ${m.orgName}`,
    text: `${lines.join('\n\n')}\n\n${m.signInLink}\n`,
    html: html(lines, { href: m.signInLink, label: 'Sign in to your account' }),
  };
}

export function passwordResetMail(m: { to: string; name: string; link: string; expiresAt: Date }): Omit<MailMessage, 'orgId'> {
  const lines = [
    m.name ? `Hello ${m.name},` : 'Hello,',
    'Someone (we hope you) asked to choose a new Brineline password for this address.',
    `Open the link to choose it. It works once and expires on ${when(m.expiresAt)}; after that, ask for a new one.`,
    'If you did not ask, ignore this message: your password stays as it is.',
  ];
  return {
    to: m.to,
    subject: 'Choose a new Brineline password',
    text: `${lines[0]}\n\n${lines[1]}\n\n${lines[2]}\n\n${m.link}\n\n${lines[3]}\n`,
    html: html(lines, { href: m.link, label: 'Choose a new password' }),
  };
}
