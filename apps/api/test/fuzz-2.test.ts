import { defineFuzz } from './fuzz/suite';

/** Half of the API fuzzing (test/fuzz/suite.ts); fuzz-1.test.ts runs the other half beside it. */
defineFuzz(1, 2);
