/** The agreement statistics of the merge, as the report file gives them. */
import { CLASSES, type TeamStatistics } from '../../core/team';

const pct = (r: number) => (Number.isFinite(r) ? `${(100 * r).toFixed(1)} %` : 'n/a');
const num = (x: number) => (Number.isFinite(x) ? x.toFixed(3) : 'n/a');

export function StatsView({ stats }: { stats: TeamStatistics }) {
  const b = stats.byState;
  return (
    <div className="team-stats" data-testid="team-stats">
      <p data-testid="team-counts">
        {stats.spectra} spectra: {b.agree} agreeing, {b.disagree} disagreeing, {b.single} single-reviewed, {b.none} not reviewed. Settled{' '}
        {stats.settled}, open {stats.open}.
      </p>
      <p>
        Agreement rate (two or more reviewers, same class and |dz|/(1+z) &lt; {stats.tolerance}): <strong data-testid="agreement-rate">{pct(stats.overall.rate)}</strong> (
        {stats.overall.agree} of {stats.overall.n}). By class:{' '}
        {stats.byClass
          .filter((c) => c.n)
          .map((c) => `${c.class} ${pct(c.rate)} (${c.agree} of ${c.n})`)
          .join(', ')}
        .
      </p>
      {stats.pairs.map((p) => (
        <div key={`${p.a}/${p.b}`} className="team-pair">
          <p>
            {p.a} / {p.b}: Cohen&apos;s kappa <strong data-testid="pair-kappa">{num(p.kappa)}</strong> on {p.n} spectra (observed {num(p.observed)}, chance{' '}
            {num(p.expected)})
          </p>
          <table className="team-confusion">
            <caption className="muted small">
              class, rows {p.a}, columns {p.b}
            </caption>
            <thead>
              <tr>
                <th />
                {CLASSES.map((c) => (
                  <th key={c}>{c}</th>
                ))}
              </tr>
            </thead>
            <tbody>
              {p.table.map((row, i) => (
                <tr key={CLASSES[i]}>
                  <th>{CLASSES[i]}</th>
                  {row.map((x, j) => (
                    <td key={j}>{x}</td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ))}
      <table className="team-reviewers">
        <thead>
          <tr>
            <th>reviewer</th>
            <th>verdicts</th>
            <th>agree with the final catalogue</th>
            <th>agree with the machine</th>
          </tr>
        </thead>
        <tbody>
          {stats.reviewers.map((r) => (
            <tr key={r.reviewer}>
              <td>{r.reviewer}</td>
              <td>{r.verdicts}</td>
              <td>
                {pct(r.withFinal.rate)} ({r.withFinal.agree} of {r.withFinal.n})
              </td>
              <td>
                {pct(r.withMachine.rate)} ({r.withMachine.agree} of {r.withMachine.n})
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="caution small">Kappa on a few dozen spectra is uncertain, and jumpy when a class is rare: read it beside the counts.</p>
    </div>
  );
}
