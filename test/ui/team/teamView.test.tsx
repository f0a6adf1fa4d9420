// @vitest-environment jsdom
/**
 * The merge screen in jsdom: two reviewers' sessions from packets of this
 * batch are merged, a session that is no packet is refused by name, the
 * disagreement is shown and settled by key 1 under the arbiter's name, and
 * the merge with its settlement is read back by a new screen (reload).
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import { fakeReview, makeSession, waitUntil } from '../harness';
import { makeResult, textBytes } from '../fixtures';
import { ServicesContext } from '../../../src/ui/state/SessionContext';
import { buildPackets } from '../../../src/ui/team/makePackets';
import { encodeSession, parseSession } from '../../../src/ui/persist/sessionFile';
import type { Session } from '../../../src/ui/state/session';
import type { ReviewDecision } from '../../../src/core/types';

vi.mock('../../../src/ui/plots', () => import('../plotsStub'));
const { TeamView } = await import('../../../src/ui/team/TeamView');

afterEach(cleanup);

async function reviewerFile(packetText: string, decide: (file: string, z: number) => Partial<ReviewDecision>): Promise<File> {
  const parsed = parseSession(packetText);
  if (!parsed.ok) throw new Error(parsed.problems.join('; '));
  const s = parsed.session;
  const entries = s.entries.map((e) => ({
    ...e,
    bytes: undefined,
    decision: {
      file: e.file,
      state: 'accepted',
      z: e.result!.z,
      zErr: null,
      class: e.result!.class,
      reviewerGrade: null,
      howSet: 'auto',
      reviewer: s.team!.reviewer,
      decidedAt: '2026-04-01T00:00:00.000Z',
      note: '',
      ...decide(e.file, e.result!.z),
    } as ReviewDecision,
  }));
  return new File([encodeSession({ ...s, entries })], `${s.team!.reviewer}.json`, { type: 'application/json' });
}

function show(session: Session) {
  return render(
    <ServicesContext.Provider value={{ session, review: fakeReview() }}>
      <TeamView />
    </ServicesContext.Provider>,
  );
}

describe('TeamView', () => {
  it('merges, refuses a session that is no packet, settles the disagreement by key and keeps it over a reload', async () => {
    const { session } = await makeSession();
    await session.addFiles([
      { path: 'a.txt', bytes: textBytes('a') },
      { path: 'b.txt', bytes: textBytes('b') },
    ]);
    await waitUntil(() => session.getSnapshot().rows.every((r) => r.status === 'ok'), 'fits');
    const built = await buildPackets(session, { reviewers: ['Ana', 'Bo'], perSpectrum: 2, seed: 4, withSpectra: false });
    const ana = await reviewerFile(built.files[0].text, () => ({}));
    const bo = await reviewerFile(built.files[1].text, (file, z) => (file === 'b.txt' ? { state: 'changed', z: z + 0.1, howSet: 'typed' } : {}));
    const plain = new File([await session.exportSession(false)], 'plain.json');

    show(session);
    await waitUntil(() => !(screen.getByTestId('merge-load') as HTMLButtonElement).disabled, 'stored merge read');
    const input = screen.getByLabelText('Reviewer session files') as HTMLInputElement;
    await act(async () => {
      fireEvent.change(input, { target: { files: [ana, bo, plain] } });
    });
    await waitUntil(() => !!screen.queryByTestId('team-counts'), 'merge');
    expect(screen.getByTestId('team-counts').textContent).toBe('2 spectra: 1 agreeing, 1 disagreeing, 0 single-reviewed, 0 not reviewed. Settled 0, open 1.');
    expect(screen.getByTestId('merge-note').textContent).toContain('plain.json: not from a review packet');
    // The open disagreements only: b.txt, with both verdicts side by side.
    expect(screen.getAllByTestId('verdict-row')).toHaveLength(1);
    expect(screen.getByTestId('verdict-row').textContent).toContain('b.txt');
    await waitUntil(() => screen.getByTestId('spectrum-view').getAttribute('data-compare-z') !== '', 'overlay of the second reviewer');

    // Without an arbiter's name the key does nothing; with it, key 1 takes Ana's verdict.
    fireEvent.keyDown(window, { key: '1' });
    expect(screen.getByTestId('team-counts').textContent).toContain('Settled 0');
    fireEvent.change(screen.getByLabelText('Arbiter name'), { target: { value: 'Cy' } });
    await waitUntil(() => (screen.getByLabelText('Arbiter name') as HTMLInputElement).value === 'Cy', 'name');
    await act(async () => {
      fireEvent.keyDown(window, { key: '1' });
    });
    await waitUntil(() => screen.getByTestId('team-counts').textContent!.includes('Settled 1, open 0.'), 'settlement');
    cleanup();

    // A new screen (as after a reload) reads the merge and the settlement back.
    show(session);
    await waitUntil(() => screen.queryByTestId('team-counts')?.textContent?.includes('Settled 1, open 0.') ?? false, 'restored merge');
    fireEvent.change(screen.getByLabelText('Team filter'), { target: { value: 'all' } });
    const finals = screen.getAllByTestId('verdict-final').map((e) => e.textContent);
    expect(finals[1]).toContain('settled by Cy');
    expect(makeResult('x').class).toBe('qso'); // the scripted fit the decisions above copy
  });
});
