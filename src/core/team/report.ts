/** The agreement statistics as a short plain-text report (printed by the command line, saved with the export). */
import { CLASSES, type TeamStatistics } from './statistics';

const pct = (r: number) => (Number.isFinite(r) ? `${(100 * r).toFixed(1)} %` : 'n/a');
const num = (x: number, d = 3) => (Number.isFinite(x) ? x.toFixed(d) : 'n/a');

export function teamReportText(stats: TeamStatistics, meta: { batchId: string; sources: readonly { name: string; reviewer: string; verdicts: number }[]; createdAt: string; software: string }): string {
  const out: string[] = [];
  out.push(`Team review report (${meta.software}), batch ${meta.batchId}, ${meta.createdAt}`);
  out.push(`Agreement rule: same class and |dz|/(1+z) < ${stats.tolerance}; a rejection is class unknown with no redshift.`);
  out.push('');
  out.push('Files merged:');
  for (const s of meta.sources) out.push(`  ${s.name}: ${s.reviewer}, ${s.verdicts} verdicts`);
  out.push('');
  const b = stats.byState;
  out.push(`Spectra: ${stats.spectra}; agreeing ${b.agree}, disagreeing ${b.disagree}, single-reviewed ${b.single}, not reviewed ${b.none}`);
  out.push(`Settled by an arbiter: ${stats.settled}; disagreements still open: ${stats.open}`);
  out.push(`Agreement rate (spectra with two or more verdicts): ${pct(stats.overall.rate)} (${stats.overall.agree} of ${stats.overall.n})`);
  out.push('By class (spectra some reviewer gave that class):');
  for (const c of stats.byClass) out.push(`  ${c.class.padEnd(8)} ${pct(c.rate).padStart(8)} (${c.agree} of ${c.n})`);
  out.push('');
  out.push("Cohen's kappa on class, each pair of reviewers (Cohen 1960):");
  if (!stats.pairs.length) out.push('  no spectrum was seen by two reviewers');
  for (const p of stats.pairs) {
    out.push(`  ${p.a} / ${p.b}: kappa ${num(p.kappa)} on ${p.n} spectra (observed agreement ${num(p.observed)}, chance ${num(p.expected)})`);
    out.push(`    class table, rows ${p.a}, columns ${p.b}: ${CLASSES.join(' ')}`);
    p.table.forEach((row, i) => out.push(`    ${CLASSES[i].padEnd(8)} ${row.map((x) => String(x).padStart(5)).join(' ')}`));
  }
  out.push('');
  out.push('Each reviewer: agreement with the final catalogue, and with the machine solution');
  for (const r of stats.reviewers)
    out.push(
      `  ${r.reviewer}: ${r.verdicts} verdicts; final ${pct(r.withFinal.rate)} (${r.withFinal.agree} of ${r.withFinal.n}); machine ${pct(r.withMachine.rate)} (${r.withMachine.agree} of ${r.withMachine.n})`,
    );
  out.push('');
  out.push('Caution: kappa on a few dozen spectra has a wide uncertainty, and a class seen rarely makes it jumpy; read it beside the counts.');
  return out.join('\n') + '\n';
}
