import { describe, expect, it } from 'vitest';
import { confidenceFeatures, confidenceScore, gradeOf, HIGH_MIN, HIGH_MIN_FEATURES, LOW_MIN, MEDIUM_MIN } from '../../../src/core/engine/confidence';

const base = { cls: 'galaxy' as const, chi2Gap: 50, nFeatures: 2, featureSnrs: [8, 5], atEdge: false, medianSnr: 5 };

describe('confidenceScore', () => {
  it('rises with the chi-square gap, the number of features and the S/N of the second feature', () => {
    const s = confidenceScore(base);
    expect(confidenceScore({ ...base, chi2Gap: 500 })).toBeGreaterThan(s);
    expect(confidenceScore({ ...base, nFeatures: 3, featureSnrs: [8, 5, 4] })).toBeGreaterThan(s);
    expect(confidenceScore({ ...base, featureSnrs: [8, 20] })).toBeGreaterThan(s);
  });

  it('is 0 for class unknown, halved at an edge, within 0..1', () => {
    expect(confidenceScore({ ...base, cls: 'unknown' })).toBe(0);
    expect(confidenceScore({ ...base, atEdge: true })).toBeCloseTo(confidenceScore(base) / 2, 12);
    const top = confidenceScore({ ...base, chi2Gap: Infinity, nFeatures: 9, featureSnrs: [100, 100, 100] });
    expect(top).toBeLessThanOrEqual(1);
    expect(top).toBeGreaterThan(0.9);
  });
});

describe('gradeOf(score, x)', () => {
  it('maps the thresholds to grades', () => {
    expect(gradeOf(HIGH_MIN)).toBe('high');
    expect(gradeOf(MEDIUM_MIN)).toBe('medium');
    expect(gradeOf(LOW_MIN)).toBe('low');
    expect(gradeOf(LOW_MIN - 1e-9)).toBe('none');
  });

  it('gives high only with enough independent features', () => {
    const x1 = confidenceFeatures({ ...base, nFeatures: HIGH_MIN_FEATURES - 1 });
    const x2 = confidenceFeatures({ ...base, nFeatures: HIGH_MIN_FEATURES });
    expect(gradeOf(0.999, x1)).toBe('medium');
    expect(gradeOf(0.999, x2)).toBe('high');
  });
});
