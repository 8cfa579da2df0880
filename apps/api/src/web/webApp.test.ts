import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import express from 'express';
import supertest from 'supertest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { webAppRouter } from './webApp';

let dist: string;
let request: ReturnType<typeof supertest>;
const chunk = `export const rows = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => `culture ${i}`))};\n`;

beforeAll(() => {
  dist = mkdtempSync(path.join(tmpdir(), 'barmkeep-web-'));
  mkdirSync(path.join(dist, 'assets'));
  writeFileSync(path.join(dist, 'index.html'), `<!doctype html><title>Barmkeep</title>${'<!-- pad -->'.repeat(200)}`);
  writeFileSync(path.join(dist, 'assets/library-AbC123.js'), chunk);
  writeFileSync(path.join(dist, 'robots.txt'), 'User-agent: *\nDisallow: /api/\n');
  const app = express();
  app.use('/api', (_req, res) => {
    res.status(404).json({ error: { code: 'not_found', message: 'no' } });
  });
  app.use(webAppRouter(dist));
  request = supertest(app);
});
afterAll(() => rmSync(dist, { recursive: true, force: true }));

describe('serving the built web app', () => {
  it('caches fingerprinted assets for a year, immutable, and gzips them', async () => {
    const res = await request.get('/assets/library-AbC123.js').set('Accept-Encoding', 'gzip').expect(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.text).toBe(chunk);
  });

  it('answers a missing asset with 404, not the HTML page', async () => {
    const res = await request.get('/assets/library-Old999.js').expect(404);
    expect(res.text).not.toContain('<!doctype html>');
  });

  it('sends index.html for app paths with no-cache so a new build is picked up', async () => {
    const res = await request.get('/cultures/some-id').set('Accept-Encoding', 'gzip').expect(200);
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.headers['content-type']).toMatch(/html/);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.text).toContain('<title>Barmkeep</title>');
  });

  it('keeps one hour for the other files (names that do not change between builds)', async () => {
    const res = await request.get('/robots.txt').expect(200);
    expect(res.headers['cache-control']).toBe('public, max-age=3600');
    expect(res.text).toContain('Disallow: /api/');
  });

  it('leaves /api alone', async () => {
    const res = await request.get('/api/nothing').expect(404);
    expect(res.headers['content-type']).toMatch(/json/);
  });
});
