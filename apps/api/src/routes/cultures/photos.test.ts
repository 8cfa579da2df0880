import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifReader from 'exif-reader';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { crc32 } from 'node:zlib';
import { buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildDregs } from '../../../test/cultureFactories';
import { startFakeS3, type FakeS3 } from '../../storage/fakeS3';

/** A real JPEG from an invented camera, with a GPS position in its EXIF. */
async function jpegWithGps() {
  return sharp({ create: { width: 2400, height: 1800, channels: 3, background: '#b9873a' } })
    .jpeg({ quality: 85 })
    .withExif({
      IFD0: { Make: 'Invented Camera Co', Model: 'Kitchen 1' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 22/1 0/1', GPSLongitudeRef: 'E', GPSLongitude: '4/1 53/1 0/1' },
    })
    .toBuffer();
}

const png = () =>
  sharp({ create: { width: 300, height: 200, channels: 4, background: { r: 20, g: 120, b: 60, alpha: 0.5 } } })
    .png()
    .toBuffer();

function chunk(type: string, data: Buffer) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body) >>> 0);
  return Buffer.concat([len, body, crc]);
}
/** A few hundred bytes that claim to be a 60,000 × 60,000 PNG: a decompression bomb's header. */
function pngBombHeader() {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(60_000, 0);
  ihdr.writeUInt32BE(60_000, 4);
  ihdr.writeUInt8(8, 8); // bit depth
  ihdr.writeUInt8(0, 9); // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', Buffer.from([0x78, 0x9c, 0x03, 0x00, 0x00, 0x00, 0x00, 0x01])),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

async function setup(t: TestApp) {
  const agent = t.agent();
  await signUp(agent);
  const res = await agent.post('/api/cultures').send(buildDregs()).expect(201);
  return { agent, cultureId: res.body.culture.id as string };
}

describe('photos on local disk', () => {
  let t: TestApp;
  let dir: string;
  beforeAll(async () => {
    dir = await mkdtemp(path.join(tmpdir(), 'barmkeep-uploads-'));
    t = await buildTestApp({ UPLOADS_DIR: dir });
  });
  afterAll(async () => {
    await t.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('re-encodes a JPEG to a web size and a thumbnail with every bit of metadata gone', async () => {
    const { agent, cultureId } = await setup(t);
    const original = await jpegWithGps();
    const before = exifReader((await sharp(original).metadata()).exif!);
    expect(before.GPSInfo?.GPSLatitude).toEqual([52, 22, 0]); // the fixture really carries a position

    const res = await agent
      .post(`/api/cultures/${cultureId}/photos`)
      .field('caption', 'Sediment after swirling')
      .attach('photo', original, { filename: 'IMG_0042.jpg', contentType: 'image/jpeg' })
      .expect(201);
    const photo = res.body.photo;
    expect(photo).toMatchObject({ caption: 'Sediment after swirling', width: 1600, height: 1200 });
    expect(photo.webUrl).toMatch(/^\/api\/cultures\//);

    for (const [url, max] of [
      [photo.webUrl, 1600],
      [photo.thumbUrl, 320],
    ] as const) {
      const img = await agent
        .get(url)
        .buffer(true)
        .parse((r, cb) => {
          const parts: Buffer[] = [];
          r.on('data', (c: Buffer) => parts.push(c));
          r.on('end', () => cb(null, Buffer.concat(parts)));
        })
        .expect(200);
      expect(img.headers['content-type']).toBe('image/webp');
      expect(img.headers['cache-control']).toContain('private');
      const meta = await sharp(img.body as Buffer).metadata();
      expect(meta.format).toBe('webp');
      expect(Math.max(meta.width!, meta.height!)).toBe(max);
      expect(meta.exif).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(meta.icc).toBeUndefined();
      expect(meta.iptc).toBeUndefined();
      expect((img.body as Buffer).includes(Buffer.from('Invented Camera'))).toBe(false);
    }
    const files = await readdir(path.join(dir, 'cultures', cultureId));
    expect(files.sort()).toEqual([`${photo.id}-thumb.webp`, `${photo.id}-web.webp`]);
    const list = (await agent.get(`/api/cultures/${cultureId}/photos`).expect(200)).body.photos;
    expect(list.map((p: { id: string }) => p.id)).toEqual([photo.id]);
  });

  it('accepts a PNG and keeps small images small', async () => {
    const { agent, cultureId } = await setup(t);
    const res = await agent
      .post(`/api/cultures/${cultureId}/photos`)
      .attach('photo', await png(), 'krausen.png')
      .expect(201);
    expect(res.body.photo).toMatchObject({ width: 300, height: 200 });
  });

  it('refuses a text file named .jpg, judged by its bytes, and stores nothing', async () => {
    const { agent, cultureId } = await setup(t);
    const res = await agent
      .post(`/api/cultures/${cultureId}/photos`)
      .attach('photo', Buffer.from('this is a shopping list, not a photo\n'), {
        filename: 'jar.jpg',
        contentType: 'image/jpeg',
      })
      .expect(400);
    expect(res.body.error.code).toBe('not_an_image');
    expect((await agent.get(`/api/cultures/${cultureId}/photos`)).body.photos).toEqual([]);
    await expect(readdir(path.join(dir, 'cultures', cultureId))).rejects.toMatchObject({ code: 'ENOENT' });
  });

  it('refuses a file over 15 MB', async () => {
    const { agent, cultureId } = await setup(t);
    const big = Buffer.concat([await png(), Buffer.alloc(15 * 1024 * 1024 + 10, 7)]);
    const res = await agent.post(`/api/cultures/${cultureId}/photos`).attach('photo', big, 'huge.png').expect(413);
    expect(res.body.error.code).toBe('file_too_large');
  });

  it('refuses a decompression bomb before decoding it', async () => {
    const { agent, cultureId } = await setup(t);
    const bomb = pngBombHeader();
    expect(bomb.length).toBeLessThan(200);
    const meta = await sharp(bomb, { limitInputPixels: false }).metadata();
    expect(meta.width! * meta.height!).toBe(3.6e9);
    const res = await agent.post(`/api/cultures/${cultureId}/photos`).attach('photo', bomb, 'tiny.png').expect(413);
    expect(res.body.error.code).toBe('image_too_large');
  });

  it('refuses a real image past the pixel limit', async () => {
    const { agent, cultureId } = await setup(t);
    const wide = await sharp({ create: { width: 8000, height: 5100, channels: 3, background: '#000' } })
      .png({ compressionLevel: 9 })
      .toBuffer();
    expect(wide.length).toBeLessThan(15 * 1024 * 1024);
    const res = await agent.post(`/api/cultures/${cultureId}/photos`).attach('photo', wide, 'wide.png').expect(413);
    expect(res.body.error.code).toBe('image_too_large');
  });

  it('needs a file, and an event of the same culture', async () => {
    const { agent, cultureId } = await setup(t);
    await agent.post(`/api/cultures/${cultureId}/photos`).field('caption', 'no file').expect(400);
    const res = await agent
      .post(`/api/cultures/${cultureId}/photos`)
      .field('eventId', 'not-an-event')
      .attach('photo', await png(), 'a.png')
      .expect(400);
    expect(res.body.error.fields['body.eventId']).toBeDefined();
    const ev = (await agent.get(`/api/cultures/${cultureId}/events`)).body.events[0];
    await agent
      .post(`/api/cultures/${cultureId}/photos`)
      .field('eventId', ev.id)
      .attach('photo', await png(), 'a.png')
      .expect(201);
  });

  it('only people who may see the culture may list, fetch, add or delete its photos', async () => {
    const { agent, cultureId } = await setup(t);
    const photo = (
      await agent
        .post(`/api/cultures/${cultureId}/photos`)
        .attach('photo', await png(), 'a.png')
        .expect(201)
    ).body.photo;
    const other = t.agent();
    await signUp(other);
    await other.get(`/api/cultures/${cultureId}/photos`).expect(404);
    await other.get(photo.webUrl).expect(404);
    await other.get(photo.thumbUrl).expect(404);
    await other
      .post(`/api/cultures/${cultureId}/photos`)
      .attach('photo', await png(), 'a.png')
      .expect(404);
    await other.delete(`/api/cultures/${cultureId}/photos/${photo.id}`).expect(404);
    await t.agent().get(photo.webUrl).expect(401);
    await agent.get(photo.webUrl).expect(200);
    await agent.delete(`/api/cultures/${cultureId}/photos/${photo.id}`).expect(204);
    await agent.get(photo.webUrl).expect(404);
  });
});

describe('photos in an S3-compatible bucket', () => {
  let t: TestApp;
  let s3: FakeS3;
  beforeAll(async () => {
    s3 = await startFakeS3({ buckets: ['barmkeep-test'] });
    t = await buildTestApp({
      STORAGE_DRIVER: 's3',
      S3_BUCKET: 'barmkeep-test',
      S3_ENDPOINT: s3.endpoint,
      S3_ACCESS_KEY_ID: s3.accessKeyId,
      S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
      S3_PREFIX: 'photos/',
    });
  });
  afterAll(async () => {
    await t.close();
    await s3.close();
  });

  it('puts both sizes in the bucket, serves them through the API only, and deletes them', async () => {
    const { agent, cultureId } = await setup(t);
    const photo = (
      await agent
        .post(`/api/cultures/${cultureId}/photos`)
        .attach('photo', await jpegWithGps(), 'a.jpg')
        .expect(201)
    ).body.photo;
    const keys = [...s3.objects.keys()].filter((k) => k.includes(photo.id)).sort();
    expect(keys).toEqual([
      `barmkeep-test/photos/cultures/${cultureId}/${photo.id}-thumb.webp`,
      `barmkeep-test/photos/cultures/${cultureId}/${photo.id}-web.webp`,
    ]);
    const stored = s3.objects.get(keys[1]!)!;
    expect(stored.contentType).toBe('image/webp');
    expect((await sharp(stored.body).metadata()).exif).toBeUndefined();
    const res = await agent
      .get(photo.webUrl)
      .buffer(true)
      .parse((r, cb) => {
        const parts: Buffer[] = [];
        r.on('data', (c: Buffer) => parts.push(c));
        r.on('end', () => cb(null, Buffer.concat(parts)));
      })
      .expect(200);
    expect(Buffer.compare(res.body as Buffer, stored.body)).toBe(0);
    expect(s3.requests.some((r) => r.method === 'GET' && r.path.endsWith(`${photo.id}-web.webp`))).toBe(true);
    await agent.delete(`/api/cultures/${cultureId}/photos/${photo.id}`).expect(204);
    expect([...s3.objects.keys()].filter((k) => k.includes(photo.id))).toEqual([]);
  });

  it('the fake refuses requests without the expected credentials', async () => {
    const res = await fetch(`${s3.endpoint}/barmkeep-test/anything`);
    expect(res.status).toBe(403);
  });
});
