/** The e-mail that carries a master's brief link. Plain text first; the HTML says the same. */
import { escapeHtml } from '../brief/html';

export interface BriefMailInput {
  url: string;
  vesselName: string;
  surveyTitle: string;
  engineerName: string;
  organisationName: string;
  expiresAt: Date;
}

const when = (d: Date) => d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

export function briefMail(m: BriefMailInput): { subject: string; text: string; html: string } {
  const subject = `Flooding brief for ${m.vesselName}`;
  const text = [
    `${m.engineerName} of ${m.organisationName} has sent you a read-only brief on the flooding of ${m.vesselName} (${m.surveyTitle}).`,
    '',
    `Open it here: ${m.url}`,
    '',
    `The link works until ${when(m.expiresAt)} and may be withdrawn earlier. Do not forward it: anyone with the link can read the brief.`,
    '',
    'The figures are estimates for planning, not a structural approval.',
  ].join('\n');
  const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#0d1217;line-height:1.5">
<p>${escapeHtml(m.engineerName)} of ${escapeHtml(m.organisationName)} has sent you a read-only brief on the flooding of
<strong>${escapeHtml(m.vesselName)}</strong> (${escapeHtml(m.surveyTitle)}).</p>
<p><a href="${escapeHtml(m.url)}" style="display:inline-block;padding:10px 16px;background:#0b2239;color:#f7f5ef;text-decoration:none;border-radius:6px;font-weight:bold">Open the brief</a></p>
<p style="font-size:14px">Or copy this address: ${escapeHtml(m.url)}</p>
<p style="font-size:14px">The link works until ${escapeHtml(when(m.expiresAt))} and may be withdrawn earlier. Do not forward it: anyone with the link can read the brief.</p>
<p style="font-size:14px">The figures are estimates for planning, not a structural approval.</p>
</body></html>`;
  return { subject, text, html };
}
