import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import jsQR from 'jsqr';
import { buildTestApp, signUp, ORIGIN, type TestApp } from '../../../test/helpers';
import { buildSlurry } from '../../../test/cultureFactories';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
  t.clock.now = new Date('2026-03-20T09:00:00Z');
});
afterAll(async () => {
  await t.close();
});

describe('label codes', () => {
  it('numbers each person’s cultures in turn, starting from the strain’s first letter, also when created at once', async () => {
    const a = t.agent();
    await signUp(a);
    const make = async (agent: typeof a, strainName: string) =>
      (
        await agent
          .post('/api/cultures')
          .send(buildSlurry(undefined, { strainName, madeAt: '2026-03-18T10:00:00Z' }))
          .expect(201)
      ).body.culture.labelCode as string;
    expect(await make(a, 'Copperbeech Ale')).toBe('C-001');
    expect(await make(a, 'millpond lager')).toBe('M-002');
    expect(await make(a, '42 Stout')).toBe('S-003');
    expect(await make(a, '№ 9')).toBe('X-004');
    const together = await Promise.all(['Oat', 'Oat', 'Oat', 'Oat', 'Oat'].map((n) => make(a, n)));
    expect([...together].sort()).toEqual(['O-005', 'O-006', 'O-007', 'O-008', 'O-009']);

    // unique per owner: someone else starts at 1
    const b = t.agent();
    await signUp(b);
    expect(await make(b, 'Copperbeech Ale')).toBe('C-001');
  });
});

describe('jar labels', () => {
  it('gives label data with a QR code for the owner only, and a PNG whose QR decodes to the culture', async () => {
    const agent = t.agent();
    await signUp(agent);
    const c = (
      await agent
        .post('/api/cultures')
        .send(buildSlurry(undefined, { madeAt: '2026-03-18T10:00:00Z', locationLabel: 'Jar B3' }))
        .expect(201)
    ).body.culture;
    const res = await agent.get(`/api/labels?ids=${c.id}`).expect(200);
    const [label] = res.body.labels;
    expect(label).toMatchObject({
      cultureId: c.id,
      code: c.labelCode,
      strainName: c.strainName,
      generation: c.generation,
      date: '2026-03-18',
      storage: '3 °C · Jar B3',
      url: `${ORIGIN}/cultures/${c.id}/quick`,
    });
    expect(label.qrSvg).toMatch(/^<svg /);
    expect(c.labelCode).toMatch(/^[A-Z]-\d{3}$/);

    const png = await agent
      .get(`/api/labels/${c.id}/png?size=small`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (d: Buffer) => chunks.push(d));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(png.status).toBe(200);
    expect(png.headers['content-type']).toBe('image/png');
    expect(png.headers['content-disposition']).toBe(`attachment; filename="label-${c.labelCode}.png"`);
    const { data, info } = await sharp(png.body as Buffer)
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    expect([info.width, info.height]).toEqual([591, 295]);
    const code = jsQR(new Uint8ClampedArray(data), info.width, info.height);
    expect(code?.data).toBe(`${ORIGIN}/cultures/${c.id}/quick`);

    const other = t.agent();
    await signUp(other);
    await other.get(`/api/labels?ids=${c.id}`).expect(404);
    await other.get(`/api/labels/${c.id}/png`).expect(404);
    await t.agent().get(`/api/labels?ids=${c.id}`).expect(401);
    const bad = await agent.get('/api/labels?ids=').expect(400);
    expect(bad.body.error.fields['query.ids']).toBeDefined();
  });
});
