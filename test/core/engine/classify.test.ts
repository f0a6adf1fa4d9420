import { describe, expect, it } from 'vitest';
import { chi2Scale, rankingScore } from '../../../src/core/engine/classify';

describe('family comparison: rankingScore(fit, scale, n) = chi2 / scale + nParams ln(n) (BIC, Schwarz 1978)', () => {
  const n = 1000;
  const lnN = Math.log(n);
  it('a family with 5 more parameters must improve chi2 by more than 5 ln(n) to win', () => {
    const simple = { chi2: 1100, nParams: 8 };
    const rich = { chi2: 1100 - 5 * lnN + 1, nParams: 13 };
    const richer = { chi2: 1100 - 5 * lnN - 1, nParams: 13 };
    expect(rankingScore(rich, 1, n)).toBeGreaterThan(rankingScore(simple, 1, n));
    expect(rankingScore(richer, 1, n)).toBeLessThan(rankingScore(simple, 1, n));
  });
  it('puts chi2 on the scale of the best fit when its reduced chi2 exceeds 1 (template mismatch), never below 1', () => {
    expect(chi2Scale({ chi2: 4 * 990, nParams: 10 }, n)).toBeCloseTo(4, 12);
    expect(chi2Scale({ chi2: 500, nParams: 10 }, n)).toBe(1);
    // a difference of 40 at reduced chi2 4 weighs what a difference of 10 does at 1
    const s = chi2Scale({ chi2: 4 * 990, nParams: 10 }, n);
    expect(rankingScore({ chi2: 4000, nParams: 10 }, s, n) - rankingScore({ chi2: 3960, nParams: 10 }, s, n)).toBeCloseTo(10, 9);
  });
});
