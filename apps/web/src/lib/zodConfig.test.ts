import { describe, expect, it } from 'vitest';

describe('zod runs jitless in the browser (no new Function under our CSP)', () => {
  it('zod adopts the config set before it loads', async () => {
    await import('./zodConfig');
    const { z } = await import('zod');
    expect(z.config().jitless).toBe(true);
    // and a schema still parses and reports errors as usual
    const schema = z.object({ name: z.string().min(1) });
    expect(schema.parse({ name: 'Heron dregs' })).toEqual({ name: 'Heron dregs' });
    expect(schema.safeParse({ name: '' }).success).toBe(false);
  });
});
