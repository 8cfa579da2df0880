import QRCode from 'qrcode';
import sharp from 'sharp';
import { eq } from 'drizzle-orm';
import type { LabelDto } from '@barmkeep/schemas';
import type { ServiceContext } from './context';
import { loadCultureForView, type Actor } from './cultureAccess';
import { users, type CultureRow } from '../db/schema';
import { FORM_WORDS, localDate } from './reminders/format';

/** What a label's QR code opens: the quick-log screen of the culture (sign-in and access rules apply there). */
export const labelUrl = (appUrl: string, id: string) => `${appUrl}/cultures/${encodeURIComponent(id)}/quick`;

async function timeZoneOf(ctx: ServiceContext, actor: Actor) {
  const [u] = await ctx.db.select({ timeZone: users.timeZone }).from(users).where(eq(users.id, actor.id)).limit(1);
  return u?.timeZone ?? 'UTC';
}

function storageWords(c: CultureRow): string {
  const temp = `${Number.isInteger(c.storageTempC) ? c.storageTempC : c.storageTempC.toFixed(1)} °C`;
  return c.locationLabel.trim() ? `${temp} · ${c.locationLabel.trim()}` : temp;
}

async function labelOf(ctx: ServiceContext, c: CultureRow, timeZone: string): Promise<LabelDto> {
  const url = labelUrl(ctx.appUrl, c.id);
  const qrSvg = await QRCode.toString(url, { type: 'svg', margin: 0, errorCorrectionLevel: 'M' });
  return {
    cultureId: c.id,
    code: c.labelCode,
    strainName: c.strainName,
    generation: c.generation,
    form: FORM_WORDS[c.form],
    date: localDate(c.madeAt, timeZone),
    storage: storageWords(c),
    url,
    qrSvg,
  };
}

/** Labels for the cultures the person may see; any other id is a 404, as on the culture pages. */
export async function getLabels(ctx: ServiceContext, actor: Actor, ids: string[]): Promise<LabelDto[]> {
  const tz = await timeZoneOf(ctx, actor);
  const labels: LabelDto[] = [];
  for (const id of [...new Set(ids)]) labels.push(await labelOf(ctx, await loadCultureForView(ctx.db, actor, id), tz));
  return labels;
}

const esc = (s: string) =>
  s.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch] ?? ch);
const clip = (s: string, n: number) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

/** Label sizes at 300 dots per inch: 50 × 25 mm (a small roll label) and 63.5 × 38.1 mm (21 to an A4 sheet). */
export const LABEL_PX = { small: { w: 591, h: 295 }, large: { w: 750, h: 450 } } as const;

/** One label as a PNG (and its code, for the file name): white ground, QR code on the left, the text beside it, drawn from an SVG by sharp. */
export async function renderLabelPng(
  ctx: ServiceContext,
  actor: Actor,
  id: string,
  size: keyof typeof LABEL_PX,
): Promise<{ png: Buffer; code: string }> {
  const [label] = await getLabels(ctx, actor, [id]);
  const { w, h } = LABEL_PX[size];
  const pad = Math.round(h * 0.08);
  const qrSize = h - 2 * pad;
  const qr = label!.qrSvg.replace('<svg ', `<svg x="${pad}" y="${pad}" width="${qrSize}" height="${qrSize}" `);
  const tx = pad * 2 + qrSize;
  const line = (h - 2 * pad) / 5;
  const big = Math.round(line * 0.95);
  const small = Math.round(line * 0.62);
  const maxChars = Math.max(8, Math.floor((w - tx - pad) / (small * 0.55)));
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}">
<rect width="100%" height="100%" fill="#ffffff"/>${qr}
<g font-family="DejaVu Sans, Liberation Sans, sans-serif" fill="#111111">
<text x="${tx}" y="${pad + big}" font-size="${big}" font-weight="bold" font-family="DejaVu Sans Mono, monospace">${esc(label!.code)}</text>
<text x="${tx}" y="${pad + big + line}" font-size="${small}" font-weight="bold">${esc(clip(label!.strainName, maxChars))}</text>
<text x="${tx}" y="${pad + big + line * 2}" font-size="${small}">Gen ${label!.generation} · ${esc(clip(label!.form, maxChars - 8))}</text>
<text x="${tx}" y="${pad + big + line * 3}" font-size="${small}">${esc(label!.date)}</text>
<text x="${tx}" y="${pad + big + line * 4}" font-size="${small}">${esc(clip(label!.storage, maxChars))}</text>
</g></svg>`;
  return { png: await sharp(Buffer.from(svg), { density: 72 }).png().toBuffer(), code: label!.code };
}
