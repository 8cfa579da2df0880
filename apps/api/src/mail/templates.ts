import type { OutgoingMail } from './mailer';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function layout(title: string, bodyHtml: string): string {
  return `<!doctype html><html><body style="margin:0;background:#f7f3ea;font-family:Helvetica,Arial,sans-serif;color:#1f2328">
<div style="max-width:520px;margin:24px auto;background:#fffdf8;border:1px solid #e2dccd;border-radius:8px;padding:24px">
<p style="margin:0 0 16px;font-weight:600;color:#0f5257">Barmkeep</p><h1 style="font-size:20px;margin:0 0 12px">${escapeHtml(title)}</h1>
${bodyHtml}</div></body></html>`;
}

export function passwordResetMail(params: {
  to: string;
  name: string;
  link: string;
  validMinutes: number;
}): OutgoingMail {
  const { to, name, link, validMinutes } = params;
  return {
    to,
    subject: 'Reset your Barmkeep password',
    text: [
      `Hello ${name},`,
      '',
      'Someone asked to reset the password of your Barmkeep account.',
      `Open this link within ${validMinutes} minutes to choose a new one (it works once):`,
      link,
      '',
      'If it was not you, ignore this message; your password stays as it is.',
    ].join('\n'),
    html: layout(
      'Reset your password',
      `<p>Hello ${escapeHtml(name)},</p><p>Someone asked to reset the password of your Barmkeep account. The link works once, within ${validMinutes} minutes.</p>
<p><a href="${escapeHtml(link)}" style="display:inline-block;background:#0f5257;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Choose a new password</a></p>
<p style="font-size:13px;color:#555">Or paste this address into your browser: ${escapeHtml(link)}</p>
<p style="font-size:13px;color:#555">If it was not you, ignore this message; your password stays as it is.</p>`,
    ),
  };
}

export function clubInvitationMail(params: {
  to: string;
  clubName: string;
  inviterName: string;
  role: 'owner' | 'steward' | 'member';
  message: string;
  link: string;
  validDays: number;
}): OutgoingMail {
  const { to, clubName, inviterName, role, message, link, validDays } = params;
  const roleWords = role === 'member' ? 'a member' : `a ${role}`;
  const note = message ? [``, `${inviterName} wrote:`, ...message.split('\n').map((l) => `> ${l}`)] : [];
  return {
    to,
    subject: `${inviterName} invited you to ${clubName} on Barmkeep`,
    text: [
      `Hello,`,
      '',
      `${inviterName} invited you to join ${clubName} on Barmkeep as ${roleWords}, to share yeast through the club's bank.`,
      ...note,
      '',
      `Open this link within ${validDays} days to join (it works once). If you have no Barmkeep account yet, you can create one from the same page:`,
      link,
      '',
      `The invitation is for ${to}. If you did not expect it, ignore this message; nothing happens unless you open the link.`,
    ].join('\n'),
    html: layout(
      `Join ${clubName}`,
      `<p>Hello,</p><p>${escapeHtml(inviterName)} invited you to join <strong>${escapeHtml(clubName)}</strong> on Barmkeep as ${roleWords}, to share yeast through the club’s bank.</p>
${message ? `<blockquote style="margin:0 0 16px;padding:8px 12px;border-left:3px solid #0f5257;color:#333;white-space:pre-wrap">${escapeHtml(message)}</blockquote>` : ''}
<p><a href="${escapeHtml(link)}" style="display:inline-block;background:#0f5257;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Open the invitation</a></p>
<p style="font-size:13px;color:#555">The link works once, within ${validDays} days. No account yet? You can create one from the same page. Or paste this address into your browser: ${escapeHtml(link)}</p>
<p style="font-size:13px;color:#555">The invitation is for ${escapeHtml(to)}. If you did not expect it, ignore this message.</p>`,
    ),
  };
}
