import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { AccessEntry, AccessTable } from './types';

export const routesDir = path.resolve(import.meta.dirname, '../../src/routes');

/** Every `access` table beside a router (src/routes/<resource>/access.ts), merged by route. */
export async function loadAccessTables() {
  const files = readdirSync(routesDir)
    .map((dir) => path.join(routesDir, dir, 'access.ts'))
    .filter((f) => existsSync(f));
  const entries = new Map<string, { entry: AccessEntry; file: string }>();
  const duplicates: string[] = [];
  for (const file of files) {
    const { access } = (await import(pathToFileURL(file).href)) as { access: AccessTable };
    const rel = path.relative(routesDir, file);
    for (const [route, entry] of Object.entries(access)) {
      if (entries.has(route)) duplicates.push(`${route} (in ${rel} and ${entries.get(route)!.file})`);
      entries.set(route, { entry, file: rel });
    }
  }
  return { entries, duplicates };
}
