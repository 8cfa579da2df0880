import { defineFuzz } from './fuzz/suite';

/** Half of the API fuzzing (test/fuzz/suite.ts); fuzz-2.test.ts runs the other half beside it. */
defineFuzz(0, 2);
