import compression from 'compression';
import express, { type Router } from 'express';
import path from 'node:path';

/**
 * The built web app (apps/web/dist) as production serves it, gzip-compressed:
 * - `/assets/*` carries a content hash in every file name (Vite), so it is cached for a year and
 *   marked immutable; a missing asset is a 404, never the HTML page (an old tab asking for a chunk
 *   of the previous build gets a clear failure, not HTML parsed as JavaScript);
 * - other files in the folder (favicon, robots.txt) keep their names across builds: one hour;
 * - every other path that is not /api gets index.html with `no-cache`, so a new build is picked
 *   up on the next visit (revalidated by ETag).
 */
export function webAppRouter(webDist: string): Router {
  const web = express.Router();
  web.use(compression());
  web.use('/assets', express.static(path.join(webDist, 'assets'), { index: false, immutable: true, maxAge: '1y' }));
  web.use('/assets', (_req, res) => {
    res.status(404).type('text/plain').send('Not found');
  });
  web.use(express.static(webDist, { index: false, maxAge: '1h' }));
  web.get(/^\/(?!api\/).*/, (_req, res) => {
    res.sendFile(path.join(webDist, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } });
  });
  return web;
}
