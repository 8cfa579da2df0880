/**
 * The yardstick for bench/load.ts: Express 5 answering a constant JSON, nothing else (no helmet,
 * no logging, no session, no database). Prints "listening on PORT".
 */
import express from 'express';
import type { AddressInfo } from 'node:net';

const app = express();
app.disable('x-powered-by');
const body = { ok: true, cultures: [{ id: 'c1', strainName: 'Constant answer', generation: 3 }] };
app.get('/bare', (_req, res) => {
  res.json(body);
});
app.get('/api/health', (_req, res) => {
  res.json({ ok: true });
});
const server = app.listen(Number(process.env.PORT ?? 0), '127.0.0.1', () => {
  console.log(`listening on ${(server.address() as AddressInfo).port}`);
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
