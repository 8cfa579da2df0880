#!/usr/bin/env node
// The web bundle budget: the JavaScript a first visit downloads before a route can render — the
// entry chunk, the route's layout and page chunks, and every chunk they import statically — must
// stay under BUDGET_KB gzip for the sign-in and library routes. Reads the Vite build manifest
// (apps/web/dist/.vite/manifest.json, `build.manifest: true`); run after `pnpm --filter @barmkeep/web build`.
// Exit 1 when a route is over budget or a module is missing from the manifest.
import { readFileSync, existsSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const DIST = path.join(ROOT, 'apps/web/dist');
const BUDGET_KB = Number(process.env.BUNDLE_BUDGET_KB ?? 170);
const ROUTES = {
  'sign-in (/sign-in)': ['src/layouts/AuthLayout', 'src/routes/sign-in'],
  'library (/cultures)': ['src/layouts/AppLayout', 'src/routes/cultures/library'],
};

const manifestPath = path.join(DIST, '.vite/manifest.json');
if (!existsSync(manifestPath)) {
  console.error(`no ${path.relative(ROOT, manifestPath)}: build the web app first (build.manifest must be on)`);
  process.exit(1);
}
const manifest = JSON.parse(readFileSync(manifestPath, 'utf8'));
const entryKey = Object.keys(manifest).find((k) => manifest[k].isEntry);
const keyOf = (mod) => Object.keys(manifest).find((k) => k.replace(/\.[jt]sx?$/, '') === mod);

/** A chunk and everything it imports statically (dynamic imports load later, on demand). */
function closure(key, seen = new Set()) {
  if (seen.has(key)) return seen;
  seen.add(key);
  for (const dep of manifest[key].imports ?? []) closure(dep, seen);
  return seen;
}
const gzipKb = (file) => gzipSync(readFileSync(path.join(DIST, file)), { level: 9 }).length / 1024;

let failed = false;
const rows = [];
for (const [route, mods] of Object.entries(ROUTES)) {
  const keys = new Set(closure(entryKey));
  for (const m of mods) {
    const k = keyOf(m);
    if (!k) {
      console.error(`${route}: ${m} is not in the manifest (renamed? update infra/bundle-budget.mjs)`);
      failed = true;
      continue;
    }
    closure(k, keys);
  }
  const files = [...keys].map((k) => manifest[k].file).filter((f) => f.endsWith('.js'));
  const kb = files.reduce((sum, f) => sum + gzipKb(f), 0);
  const entryKb = [...closure(entryKey)].map((k) => manifest[k].file).reduce((s, f) => s + gzipKb(f), 0);
  rows.push({ route, chunks: files.length, entryKb, kb });
  if (kb > BUDGET_KB) failed = true;
}
console.log(`initial JavaScript per route, gzip level 9 (budget ${BUDGET_KB} KB):`);
for (const r of rows)
  console.log(
    `  ${r.route.padEnd(22)} ${r.kb.toFixed(1).padStart(7)} KB in ${r.chunks} chunks (entry + static imports ${r.entryKb.toFixed(1)} KB) ${r.kb > BUDGET_KB ? 'OVER BUDGET' : 'ok'}`,
  );
if (process.argv.includes('--json')) console.log(JSON.stringify(rows));
process.exit(failed ? 1 : 0);
