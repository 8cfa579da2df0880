import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { eq } from 'drizzle-orm';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { buildTestApp, signUp, type TestApp } from './helpers';
import { buildDregs } from './cultureFactories';
import { culturePhotos } from '../src/db/schema';

/**
 * Hostile photo uploads, each refused with a 4xx and nothing left behind: no file under the
 * uploads folder and no photo row. (routes/cultures/photos.test.ts covers a text file named .jpg,
 * a PNG bomb header, a real image past the pixel limit and a file just over the size limit.)
 */

let t: TestApp;
let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'barmkeep-attacks-'));
  t = await buildTestApp({ UPLOADS_DIR: dir });
});
afterAll(async () => {
  await t.close();
  await rm(dir, { recursive: true, force: true });
});

async function files(root: string): Promise<string[]> {
  const out: string[] = [];
  for (const e of await readdir(root, { withFileTypes: true, recursive: true })) if (e.isFile()) out.push(e.name);
  return out;
}

const jpeg = (w = 64, h = 48) =>
  sharp({ create: { width: w, height: h, channels: 3, background: '#a0703a' } })
    .jpeg({ quality: 80 })
    .toBuffer();

/** A real small JPEG whose frame header (SOF0) claims 30,000 × 30,000 pixels. */
async function jpegBomb() {
  const buf = Buffer.from(await jpeg());
  for (let i = 2; i < buf.length - 9; i++) {
    if (buf[i] === 0xff && (buf[i + 1] === 0xc0 || buf[i + 1] === 0xc2)) {
      buf.writeUInt16BE(30_000, i + 5); // height
      buf.writeUInt16BE(30_000, i + 7); // width
      return buf;
    }
  }
  throw new Error('no SOF marker');
}

const svgWithScript = Buffer.from(
  '<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="100" height="100" onload="alert(1)">' +
    '<script>alert(document.cookie)</script><rect width="100" height="100" fill="#a0703a"/></svg>',
);

const attacks: {
  name: string;
  file: () => Promise<Buffer> | Buffer;
  filename: string;
  contentType: string;
  status: number;
  code: string;
}[] = [
  {
    name: 'an SVG with a script, named .png',
    file: () => svgWithScript,
    filename: 'jar.png',
    contentType: 'image/png',
    status: 400,
    code: 'not_an_image',
  },
  {
    name: 'an SVG with a script, as itself',
    file: () => svgWithScript,
    filename: 'jar.svg',
    contentType: 'image/svg+xml',
    status: 400,
    code: 'not_an_image',
  },
  {
    name: 'an HTML page named .jpg',
    file: () => Buffer.from('<!doctype html><script>alert(1)</script>'),
    filename: 'jar.jpg',
    contentType: 'image/jpeg',
    status: 400,
    code: 'not_an_image',
  },
  {
    name: 'a PDF named .webp',
    file: () => Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF'),
    filename: 'jar.webp',
    contentType: 'image/webp',
    status: 400,
    code: 'not_an_image',
  },
  {
    name: 'a truncated JPEG',
    file: async () => (await jpeg(800, 600)).subarray(0, 700),
    filename: 'jar.jpg',
    contentType: 'image/jpeg',
    status: 400,
    code: 'not_an_image',
  },
  {
    name: 'a JPEG claiming 30,000 × 30,000 pixels',
    file: jpegBomb,
    filename: 'jar.jpg',
    contentType: 'image/jpeg',
    status: 413,
    code: 'image_too_large',
  },
  {
    name: 'a 20 MB file',
    file: async () => Buffer.concat([await jpeg(), Buffer.alloc(20 * 1024 * 1024, 1)]),
    filename: 'jar.jpg',
    contentType: 'image/jpeg',
    status: 413,
    code: 'file_too_large',
  },
  {
    name: 'an empty file',
    file: () => Buffer.alloc(0),
    filename: 'jar.jpg',
    contentType: 'image/jpeg',
    status: 400,
    code: 'not_an_image',
  },
];

describe('hostile photo uploads', () => {
  it.each(attacks)('refuses $name with $status and writes nothing', async (attack) => {
    const agent = t.agent();
    await signUp(agent);
    const culture = (await agent.post('/api/cultures').send(buildDregs()).expect(201)).body.culture as { id: string };
    const before = await files(dir);
    const res = await agent
      .post(`/api/cultures/${culture.id}/photos`)
      .attach('photo', await attack.file(), { filename: attack.filename, contentType: attack.contentType });
    expect({ status: res.status, code: res.body?.error?.code }).toEqual({ status: attack.status, code: attack.code });
    expect(await files(dir)).toEqual(before);
    const rows = await t.database.db.select().from(culturePhotos).where(eq(culturePhotos.cultureId, culture.id));
    expect(rows).toEqual([]);
  });

  it('still takes a proper photo afterwards (the checks are not refusing everything)', async () => {
    const agent = t.agent();
    await signUp(agent);
    const culture = (await agent.post('/api/cultures').send(buildDregs()).expect(201)).body.culture as { id: string };
    await agent
      .post(`/api/cultures/${culture.id}/photos`)
      .attach('photo', await jpeg(), 'jar.jpg')
      .expect(201);
    expect((await files(dir)).length).toBeGreaterThan(0);
  });
});
