import { describe, expect, it } from 'vitest';
import { readableSource } from './sources';

describe('readableSource', () => {
  it('keeps the named source and says the other tags in words', () => {
    expect(readableSource('George Fix, Principles of Brewing Science, 2nd ed. (1999) [PUB-2]')).toBe(
      'George Fix, Principles of Brewing Science, 2nd ed. (1999)',
    );
    expect(readableSource('rule of thumb 4%/year at 4 °C [CP]; Q10 = 2 [MEM]')).toBe(
      'rule of thumb 4%/year at 4 °C (common practice); Q10 = 2 (from memory, no source)',
    );
    expect(readableSource('1.2 billion cells/mL (a maker’s figure via [PUB-2]), deliberately wide')).toBe(
      '1.2 billion cells/mL (a maker’s figure), deliberately wide',
    );
  });
});
