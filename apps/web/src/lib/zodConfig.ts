// zod compiles object parsers with `new Function` when it may. The app's Content-Security-Policy
// (script-src 'self', set by helmet in the API) forbids that, and zod's probe for it is reported
// as a CSP violation on every page that defines a schema. `jitless` turns the probe and the compiled
// fast path off; plain parsing is plenty fast for forms.
//
// zod keeps its global config in `globalThis.__zod_globalConfig` and adopts an object already
// there (zod/v4/core/core.js), so setting the flag here needs none of zod's code in the entry chunk
// (importing `config` from zod pulls ~4 KB gzip of it into every page's initial JavaScript).
// main.tsx imports this module first, before any schema is defined (the probe runs once, at the
// first object schema); zodConfig.test.ts checks that zod still reads the flag.
const holder = globalThis as { __zod_globalConfig?: { jitless?: boolean } };
(holder.__zod_globalConfig ??= {}).jitless = true;

export {};
