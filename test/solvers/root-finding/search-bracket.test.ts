import { describe, expect, it } from 'vitest';
import { searchBracket } from '../../../solvers/root-finding/search-bracket.js';

describe('searchBracket', () => {
  it('searchBracket(x − 3, 10, 0.1) steps down to a bracket around 3', () => {
    const search = searchBracket((x) => x - 3, 10, 0.1);
    // ref: common practice, a bracket holds values of opposite sign at its ends
    expect(search.found && search.lo <= 3 && search.hi >= 3).toBe(true);
  });

  it('searchBracket(x − 3, 1, 0.1) steps up to a bracket around 3', () => {
    const search = searchBracket((x) => x - 3, 1, 0.1);
    // ref: common practice, a bracket holds values of opposite sign at its ends
    expect(search.found && search.lo <= 3 && search.hi >= 3).toBe(true);
  });

  it('searchBracket reports the closest point when f never changes sign', () => {
    const search = searchBracket((x) => 1 + 1 / x, 1, 0.1);
    // ref: common practice, 1 + 1/x > 1 for x > 0: no root to bracket
    expect(search.found).toBe(false);
  });
});
