import type { OutgoingMail } from './mailer';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function layout(title: string, bodyHtml: string): string {
  return `<!doctype html><html><body style="margin:0;background:#f7f3ea;font-family:Helvetica,Arial,sans-serif;color:#1f2328">
<div style="max-width:520px;margin:24px auto;background:#fffdf8;border:1px solid #e2dccd;border-radius:8px;padding:24px">
<p style="margin:0 0 16px;font-weight:600;color:#0f5257">Barmkeep</p><h1 style="font-size:20px;margin:0 0 12px">${escapeHtml(title)}</h1>
${bodyHtml}</div></body></html>`;
}

export function passwordResetMail(params: { to: string; name: string; link: string; validMinutes: number }): OutgoingMail {
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
