import { NOTIFICATION_KIND_LABELS, NOTIFICATION_KINDS, type NotificationKind } from '@barmkeep/schemas';
import type { OutgoingMail } from './mailer';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function layout(title: string, bodyHtml: string, footerHtml: string): string {
  return `<!doctype html><html><body style="margin:0;background:#f7f3ea;font-family:Helvetica,Arial,sans-serif;color:#1f2328">
<div style="max-width:560px;margin:24px auto;background:#fffdf8;border:1px solid #e2dccd;border-radius:8px;padding:24px">
<p style="margin:0 0 16px;font-weight:600;color:#0f5257">Barmkeep</p><h1 style="font-size:20px;margin:0 0 12px">${escapeHtml(title)}</h1>
${bodyHtml}
<hr style="border:0;border-top:1px solid #e2dccd;margin:24px 0 12px">
<p style="font-size:13px;color:#555;margin:0">${footerHtml}</p></div></body></html>`;
}

export interface MailNotice {
  kind: string;
  title: string;
  body: string;
  /** absolute address of the thing the notice is about */
  url: string;
}

interface Recipient {
  to: string;
  name: string;
  /** absolute address of the e-mail preferences page (works signed out) */
  preferencesUrl: string;
  /** one-click unsubscribe endpoint (RFC 8058) */
  unsubscribeUrl: string;
}

function footer(r: Recipient, why: string) {
  return {
    text: ['', '—', why, `Change what Barmkeep e-mails you, or stop it, without signing in: ${r.preferencesUrl}`],
    html: `${escapeHtml(why)} <a href="${escapeHtml(r.preferencesUrl)}" style="color:#0f5257">Change what Barmkeep e-mails you, or stop it</a> (no sign-in needed).`,
  };
}

const unsubscribeHeaders = (r: Recipient) => ({
  'List-Unsubscribe': `<${r.unsubscribeUrl}>`,
  'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
});

/** One reminder, sent as it fires. */
export function reminderMail(r: Recipient, n: MailNotice): OutgoingMail {
  const f = footer(r, 'You get an e-mail for each reminder.');
  return {
    to: r.to,
    subject: n.title,
    text: [`Hello ${r.name},`, '', n.title, ...(n.body ? ['', n.body] : []), '', `Open it: ${n.url}`, ...f.text].join(
      '\n',
    ),
    html: layout(
      n.title,
      `<p>Hello ${escapeHtml(r.name)},</p>${n.body ? `<p>${escapeHtml(n.body)}</p>` : ''}
<p><a href="${escapeHtml(n.url)}" style="display:inline-block;background:#0f5257;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Open in Barmkeep</a></p>`,
      f.html,
    ),
    headers: unsubscribeHeaders(r),
  };
}

const kindOrder = (k: string) => {
  const i = (NOTIFICATION_KINDS as readonly string[]).indexOf(k);
  return i === -1 ? NOTIFICATION_KINDS.length : i;
};
const kindLabel = (k: string) => NOTIFICATION_KIND_LABELS[k as NotificationKind] ?? 'Other notices';

/** Group notices by kind in the order of NOTIFICATION_KINDS, keeping each group's own order. */
export function groupNotices<T extends { kind: string }>(notices: T[]): { kind: string; label: string; items: T[] }[] {
  const groups = new Map<string, T[]>();
  for (const n of notices) groups.set(n.kind, [...(groups.get(n.kind) ?? []), n]);
  return [...groups.entries()]
    .sort(([a], [b]) => kindOrder(a) - kindOrder(b))
    .map(([kind, items]) => ({ kind, label: kindLabel(kind), items }));
}

/** The day's reminders in one e-mail, grouped by kind. */
export function digestMail(r: Recipient, dayWords: string, notices: MailNotice[], appUrl: string): OutgoingMail {
  const groups = groupNotices(notices);
  const count = `${notices.length} reminder${notices.length === 1 ? '' : 's'}`;
  const f = footer(r, 'You get one digest a day.');
  const text = [`Hello ${r.name},`, '', `${count} for ${dayWords}:`];
  for (const g of groups) {
    text.push('', `${g.label} (${g.items.length})`);
    for (const n of g.items) text.push(`- ${n.title}`, `  ${n.url}`);
  }
  text.push('', `All notices: ${appUrl}/notifications`, ...f.text);
  const html = groups
    .map(
      (g) =>
        `<h2 style="font-size:16px;margin:20px 0 8px">${escapeHtml(g.label)} (${g.items.length})</h2><ul style="padding-left:18px;margin:0">${g.items
          .map(
            (n) =>
              `<li style="margin:0 0 8px"><a href="${escapeHtml(n.url)}" style="color:#0f5257">${escapeHtml(n.title)}</a>${
                n.body ? `<br><span style="font-size:13px;color:#555">${escapeHtml(n.body)}</span>` : ''
              }</li>`,
          )
          .join('')}</ul>`,
    )
    .join('');
  return {
    to: r.to,
    subject: `Barmkeep: ${count} for ${dayWords}`,
    text: text.join('\n'),
    html: layout(
      `${count} for ${dayWords}`,
      `<p>Hello ${escapeHtml(r.name)},</p>${html}<p><a href="${escapeHtml(appUrl)}/notifications" style="color:#0f5257">All notices</a></p>`,
      f.html,
    ),
    headers: unsubscribeHeaders(r),
  };
}
