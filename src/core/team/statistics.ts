/**
 * Agreement statistics of a merged batch: the share of spectra seen by two
 * or more reviewers on which all agree (overall, and by class: among spectra
 * some reviewer gave that class), Cohen's kappa on class for each pair of
 * reviewers with their class table, and each reviewer's agreement with the
 * final catalogue and with the machine (same rule). A rejection counts as
 * class 'unknown'.
 */
import type { SpectrumClass } from '../types';
import { verdictsAgree, type AgreementRule, type AgreementState } from './agreement';
import type { Consensus } from './consensus';
import { cohenKappa, confusionTable, type KappaResult } from './kappa';
import type { MergedBatch } from './merge';

export const CLASSES: readonly SpectrumClass[] = ['qso', 'galaxy', 'star', 'unknown'];

export interface Rate {
  /** Cases compared. */
  n: number;
  /** Of which agree. */
  agree: number;
  /** agree / n; NaN when n = 0. */
  rate: number;
}

export interface PairStats extends KappaResult {
  a: string;
  b: string;
  /** Rows: a's class, columns: b's class, in CLASSES order. */
  table: number[][];
}

export interface ReviewerStats {
  reviewer: string;
  verdicts: number;
  withFinal: Rate;
  withMachine: Rate;
}

export interface TeamStatistics {
  tolerance: number;
  spectra: number;
  byState: Record<AgreementState, number>;
  settled: number;
  /** Disagreements not yet settled. */
  open: number;
  /** Over spectra with two or more verdicts. */
  overall: Rate;
  byClass: ({ class: SpectrumClass } & Rate)[];
  pairs: PairStats[];
  reviewers: ReviewerStats[];
}

const rate = (n: number, agree: number): Rate => ({ n, agree, rate: n ? agree / n : NaN });

export function teamStatistics(merged: MergedBatch, consensus: readonly Consensus[], rule: AgreementRule): TeamStatistics {
  const byState: Record<AgreementState, number> = { agree: 0, disagree: 0, single: 0, none: 0 };
  let settled = 0;
  let open = 0;
  const cls = new Map(CLASSES.map((c) => [c, { n: 0, agree: 0 }]));
  for (const c of consensus) {
    byState[c.state]++;
    if (c.settlement) settled++;
    else if (c.state === 'disagree') open++;
    if (c.verdicts.length < 2) continue;
    for (const k of new Set(c.verdicts.map((v) => v.decision.class))) {
      const e = cls.get(k)!;
      e.n++;
      if (c.state === 'agree') e.agree++;
    }
  }
  const multi = byState.agree + byState.disagree;

  const reviewers = [...new Set(merged.verdicts.filter((v) => v.counted).map((v) => v.reviewer))].sort();
  const pairs: PairStats[] = [];
  for (let i = 0; i < reviewers.length; i++)
    for (let j = i + 1; j < reviewers.length; j++) {
      const a = reviewers[i];
      const b = reviewers[j];
      const labels: [SpectrumClass, SpectrumClass][] = [];
      for (const c of consensus) {
        const va = c.verdicts.find((v) => v.reviewer === a);
        const vb = c.verdicts.find((v) => v.reviewer === b);
        if (va && vb) labels.push([va.decision.class, vb.decision.class]);
      }
      if (!labels.length) continue;
      const table = confusionTable(labels, CLASSES);
      pairs.push({ a, b, table, ...cohenKappa(table) });
    }

  const machine = new Map(merged.spectra.map((s) => [s.id, s.machine]));
  const perReviewer = reviewers.map((reviewer): ReviewerStats => {
    let verdicts = 0;
    const fin = { n: 0, agree: 0 };
    const mac = { n: 0, agree: 0 };
    for (const c of consensus) {
      const v = c.verdicts.find((x) => x.reviewer === reviewer);
      if (!v) continue;
      verdicts++;
      if (c.final) {
        fin.n++;
        if (verdictsAgree(v.decision, c.final, rule)) fin.agree++;
      }
      const m = machine.get(c.id);
      if (m) {
        mac.n++;
        if (verdictsAgree(v.decision, { class: m.class, z: m.z }, rule)) mac.agree++;
      }
    }
    return { reviewer, verdicts, withFinal: rate(fin.n, fin.agree), withMachine: rate(mac.n, mac.agree) };
  });

  return {
    tolerance: rule.tolerance,
    spectra: consensus.length,
    byState,
    settled,
    open,
    overall: rate(multi, byState.agree),
    byClass: CLASSES.map((c) => ({ class: c, ...rate(cls.get(c)!.n, cls.get(c)!.agree) })),
    pairs,
    reviewers: perReviewer,
  };
}
