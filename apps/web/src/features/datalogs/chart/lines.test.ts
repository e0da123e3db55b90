import { describe, expect, it } from 'vitest';
import { mergeRows } from './lines';

describe('mergeRows', () => {
  it('puts every line on one time-ordered row set, blank where a line has no sample', () => {
    const rows = mergeRows([
      { key: 'a', t: [0, 2], v: [1, 3] },
      { key: 'b', t: [1, 2], v: [10, 30] },
    ]);
    expect(rows).toEqual([{ t: 0, a: 1 }, { t: 1, b: 10 }, { t: 2, a: 3, b: 30 }]);
  });
});
