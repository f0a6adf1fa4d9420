import { describe, it, expect } from 'vitest';
import { truthCsv, parseTruthCsv, type SampleTruthRow } from '../../../src/core/sim/sampleSet';
import { PLAN } from '../../../src/core/sim/samplePlan';
import { brokenFiles } from '../../../src/core/sim/sampleBroken';

describe('truthCsv / parseTruthCsv', () => {
  it('round-trip a spectrum row and a broken row (with a comma and quote in the phrase)', () => {
    const rows: SampleTruthRow[] = [
      { file: 'a.csv', objectId: 'MRX-0001', class: 'qso', subtype: '', z: 2.5, snr: 10, layout: 'csv-ivar', nPix: 4075, waveMinA: 3600, waveMaxA: 9198.193, air: 0, idInFile: 1, expectedError: '' },
      { file: 'broken/x.csv', objectId: '', class: '', subtype: '', z: NaN, snr: NaN, layout: 'broken', nPix: 0, waveMinA: NaN, waveMaxA: NaN, air: 0, idInFile: 0, expectedError: `'bright', "quoted"` },
    ];
    const back = parseTruthCsv(truthCsv(rows));
    expect(back[0]).toEqual(rows[0]);
    expect(back[1].expectedError).toBe(rows[1].expectedError);
    expect(Number.isNaN(back[1].z)).toBe(true);
  });
});

describe('samplePlan', () => {
  it('covers every class and S/N from poor (< 2) to excellent (> 40)', () => {
    expect(new Set(PLAN.map((p) => p.cls)).size).toBe(4);
    expect(Math.min(...PLAN.map((p) => p.snr))).toBeLessThan(2);
    expect(Math.max(...PLAN.map((p) => p.snr))).toBeGreaterThan(40);
  });
});

describe('brokenFiles', () => {
  it('gives a dozen distinct files, each with a phrase to expect', () => {
    const b = brokenFiles();
    expect(b.length).toBe(12);
    expect(new Set(b.map((f) => f.name)).size).toBe(12);
    for (const f of b) expect(f.expected.length).toBeGreaterThan(2);
  });
});
