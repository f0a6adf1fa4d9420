// @vitest-environment jsdom
/**
 * The review loop where a reviewer could be misled: a star that lost to many
 * galaxy minima, undo, a reload in the middle of a choice, review flags.
 */
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup, act, within } from '@testing-library/react';
import { fakeReview, makeSession, waitUntil, ScriptedFitter } from './harness';
import { textBytes, makeResult, makeCandidate, makeFailed } from './fixtures';
import type { Candidate } from '../../src/core/types';
import { flagsOf } from '../../src/ui/review/flags';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');
const { SessionDb } = await import('../../src/ui/persist/sessionDb');
const { Session } = await import('../../src/ui/state/session');

afterEach(cleanup);

const press = (key: string) => act(() => void fireEvent.keyDown(window, { key }));

/** A galaxy wins; ten more galaxy minima rank above the best star (invented numbers). */
function galaxyWinsStarLast(): Candidate[] {
  const c: Candidate[] = [];
  for (let i = 0; i < 11; i++) c.push(makeCandidate(1.41 - i * 0.07, 'galaxy', i * 5));
  c.push(makeCandidate(0.00012, 'star', 80));
  c.push(makeCandidate(2.2, 'qso', 95));
  return c;
}

async function batch(files: string[], script = (f: string) => makeResult(f)) {
  const made = await makeSession(undefined, new ScriptedFitter(script));
  await made.session.setReviewer('Tester');
  await made.session.addFiles(files.map((f) => ({ path: f, bytes: textBytes(f) })));
  await waitUntil(() => made.session.getSnapshot().rows.every((r) => r.status === 'ok' || r.status === 'failed'), 'fits');
  return made;
}

describe('every class one key away', () => {
  it('a star that lost to many galaxy minima is on a number key, and the list names each class', async () => {
    const cands = galaxyWinsStarLast();
    const { session, db } = await batch(['sp06.txt'], (f) => makeResult(f, { candidates: cands }));
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    const rows = within(screen.getByTestId('candidate-list')).getAllByTestId('candidate-row');
    expect(rows.length).toBeLessThanOrEqual(9);
    // Walk the keys as a reviewer would and note the class each one shows.
    const shown: { key: number; cls: string; z: string }[] = [];
    for (let k = 1; k <= rows.length; k++) {
      press(String(k));
      const sol = screen.getByTestId('solution').textContent!;
      shown.push({ key: k, cls: /(qso|galaxy|star)/.exec(sol.replace(/set by.*/, ''))![1], z: screen.getByTestId('solution-z').textContent! });
    }
    expect(new Set(shown.map((s) => s.cls))).toEqual(new Set(['galaxy', 'star', 'qso']));
    const star = shown.find((s) => s.cls === 'star')!;
    expect(Number(star.z)).toBeCloseTo(cands.find((c) => c.class === 'star')!.z, 5);
    // Each row says its class in words.
    expect(rows.map((r) => within(r).getByTestId('candidate-class').textContent)).toContain('star best star');
    press(String(star.key));
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    expect(session.getSnapshot().rows[0].decision).toMatchObject({ state: 'changed', class: 'star', howSet: 'candidate' });
    db.close();
  });

  it('Shift+S shows the best star solution, Shift+G the best galaxy; a class the fit lacks is said plainly', async () => {
    const cands = galaxyWinsStarLast();
    const { session, db } = await batch(['sp06.txt', 'noStar.txt'], (f) =>
      makeResult(f, { candidates: f === 'noStar.txt' ? [makeCandidate(1.2, 'qso', 0)] : cands }),
    );
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('S');
    expect(screen.getByTestId('solution').textContent).toMatch(/star/);
    expect(Number(screen.getByTestId('solution-z').textContent)).toBeCloseTo(cands.find((c) => c.class === 'star')!.z, 5);
    press('G');
    expect(Number(screen.getByTestId('solution-z').textContent)).toBeCloseTo(cands[0].z, 5);
    press('j');
    await screen.findByText('OBJ-noStar.txt', { selector: 'h2' });
    await screen.findByTestId('candidate-list');
    press('S');
    expect(await screen.findByText(/no star solution among its candidates/)).toBeTruthy();
    db.close();
  });
});

describe('comparing two solutions', () => {
  it('o overlays the next candidate (model and markers) beside the shown one, cycles, and Escape turns it off', async () => {
    const cands = [makeCandidate(1.2, 'qso', 0), makeCandidate(0.35, 'galaxy', 40), makeCandidate(0.0001, 'star', 70)];
    const { session, db } = await batch(['a.txt'], (f) => makeResult(f, { candidates: cands }));
    const review = fakeReview({ solutionModel: vi.fn(async () => new Float64Array(200)) });
    render(<App services={{ session, review }} />);
    await screen.findByText('200 px');
    const view = () => screen.getByTestId('spectrum-view');
    press('o');
    expect((await screen.findByTestId('compare-note')).textContent).toMatch(/candidate 2: z = 0\.35000 galaxy/);
    await waitUntil(() => view().getAttribute('data-compare-model') === 'yes', 'compared model');
    expect(review.solutionModel).toHaveBeenCalledWith(expect.any(String), cands[1].z, cands[1].family);
    expect(Number(view().getAttribute('data-compare-z'))).toBe(cands[1].z);
    // The shown solution stays what it was.
    expect(Number(view().getAttribute('data-z'))).toBe(cands[0].z);
    press('o');
    expect(screen.getByTestId('compare-note').textContent).toMatch(/candidate 3/);
    press('o');
    expect(screen.queryByTestId('compare-note')).toBeNull();
    press('o');
    expect(screen.getByTestId('compare-note')).toBeTruthy();
    press('Escape');
    expect(screen.queryByTestId('compare-note')).toBeNull();
    expect(view().getAttribute('data-compare-z')).toBe('');
    cleanup();
    db.close();
  });
});

describe('undo', () => {
  it('leaves nothing staged: the automatic solution is shown as unreviewed, and accepting keeps it', async () => {
    const { session, db } = await batch(['a.txt', 'b.txt']);
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    const autoZ = screen.getByTestId('solution-z').textContent;
    press('2');
    press('w');
    press('g');
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    await screen.findByText('OBJ-b.txt', { selector: 'h2' });
    press('k');
    await screen.findByText('OBJ-a.txt', { selector: 'h2' });
    await screen.findByTestId('decision-state');
    press('u');
    await waitUntil(() => !session.getSnapshot().rows[0].decision, 'undo');
    expect((await screen.findByTestId('unreviewed-caution')).textContent).toMatch(/Automatic redshift, not reviewed/);
    expect(screen.getByTestId('solution-z').textContent).toBe(autoZ);
    expect(screen.getByTestId('flag-broad-absorption').getAttribute('aria-pressed')).toBe('false');
    expect((screen.getByLabelText('Your confidence grade') as HTMLSelectElement).value).toBe('');
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision again');
    const d = session.getSnapshot().rows[0].decision!;
    expect(d).toMatchObject({ state: 'accepted', howSet: 'auto', reviewerGrade: null });
    expect(d.z).toBe(Number(autoZ));
    expect(flagsOf(d)).toEqual([]);
    db.close();
  });
});

describe('reload', () => {
  it('keeps the filter, the order, the open spectrum and a typed z that was not saved yet', async () => {
    const { session, db, name } = await batch(['a.txt', 'b.txt', 'c.txt']);
    const review = fakeReview();
    const first = render(<App services={{ session, review }} />);
    await screen.findByText('200 px');
    press('f'); // all -> not yet reviewed
    press('s'); // order loaded -> low machine grade first
    const filter = (screen.getByLabelText('Filter') as HTMLSelectElement).value;
    const order = (screen.getByLabelText('Order') as HTMLSelectElement).value;
    press('j');
    press('j');
    await screen.findByText('OBJ-c.txt', { selector: 'h2' });
    press('z');
    fireEvent.change(screen.getByLabelText('Type a redshift'), { target: { value: '0.8' } });
    fireEvent.submit(screen.getByLabelText('Type a redshift').closest('form')!);
    await screen.findByText('typed redshift', { exact: false });
    const stagedZ = screen.getByTestId('solution-z').textContent;
    await waitUntil(() => (session.stagedDraft() as { key?: string } | null)?.key === session.getSnapshot().rows[2].key, 'staged choice stored');
    first.unmount();
    db.close();

    // A new page on the same database.
    const db2 = await SessionDb.open(name);
    const s2 = new Session(db2, new ScriptedFitter());
    render(<App services={{ session: s2, review }} />);
    await screen.findByText('OBJ-c.txt', { selector: 'h2' });
    expect((screen.getByLabelText('Filter') as HTMLSelectElement).value).toBe(filter);
    expect((screen.getByLabelText('Order') as HTMLSelectElement).value).toBe(order);
    await waitUntil(() => screen.queryByTestId('solution-z')?.textContent === stagedZ, 'staged z back');
    expect(screen.getByTestId('unreviewed-caution').textContent).toMatch(/Not yet saved/);
    expect((screen.getByLabelText('Type a redshift') as HTMLInputElement).value).toBe('0.8');
    // The next accept keeps it on the spectrum it was typed for.
    press('a');
    const keyC = s2.getSnapshot().rows.find((r) => r.file === 'c.txt')!.key;
    await waitUntil(() => !!s2.row(keyC)?.decision, 'decision');
    expect(s2.row(keyC)!.decision).toMatchObject({ howSet: 'typed', z: Number(stagedZ) });
    expect(s2.getSnapshot().rows.filter((r) => r.decision).length).toBe(1);
    cleanup();
    db2.close();
  });
});

describe('review flags', () => {
  it('one key each, stored with the decision, shown in the list and filtered', async () => {
    const { session, db } = await batch(['a.txt', 'b.txt']);
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('w');
    press('d');
    press('y');
    press('y'); // toggled off again
    expect(screen.getByTestId('flag-broad-absorption').getAttribute('aria-pressed')).toBe('true');
    expect(screen.getByTestId('flag-sky-residuals').getAttribute('aria-pressed')).toBe('false');
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    expect(flagsOf(session.getSnapshot().rows[0].decision)).toEqual(['broad-absorption', 'low-snr']);
    const row = screen.getByText('OBJ-a.txt', { selector: '.c-id' }).closest('[role=row]') as HTMLElement;
    expect(within(row).getByLabelText('2 flags')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Filter'), { target: { value: 'flagged' } });
    const shown = screen.getAllByTestId('spectrum-row').map((r) => r.querySelector('.c-id')!.textContent);
    expect(shown).toEqual(['OBJ-a.txt']);
    cleanup();
    db.close();
  });
});

describe('list: failed files, names, duplicates', () => {
  it('a failed file shows its error once and no redshift tools; failures are not counted as work and can be removed', async () => {
    const { session, db } = await batch(['good.txt', 'junk.dat'], (f) => (f === 'junk.dat' ? makeFailed(f, 'junk.dat: not a spectrum') : makeResult(f)));
    const review = fakeReview({ openSpectrum: vi.fn(async (_k: string, file: string) => (file === 'junk.dat' ? { kind: 'read-error' as const, message: 'junk.dat: not a spectrum' } : { kind: 'spectrum' as const, spectrum: (await import('./fixtures')).makeSpectrum(file) })) });
    render(<App services={{ session, review }} />);
    await screen.findByText('200 px');
    expect(screen.getByTestId('review-counts').textContent).toMatch(/^0 of 1 reviewed/);
    fireEvent.click(screen.getByText('junk.dat', { selector: '.c-id' }));
    await screen.findByText('junk.dat', { selector: 'h2' });
    await waitUntil(() => !screen.queryByText('Opening the spectrum…'), 'spectrum answer');
    expect(within(screen.getByTestId('review-panel')).getAllByText('junk.dat: not a spectrum')).toHaveLength(1);
    expect(screen.queryByLabelText('Type a redshift')).toBeNull();
    expect(screen.queryByTestId('candidate-list')).toBeNull();
    fireEvent.click(screen.getByTestId('remove-failed'));
    fireEvent.click(within(screen.getByRole('group', { name: 'Confirm removal' })).getByText('Remove'));
    await waitUntil(() => session.getSnapshot().rows.length === 1, 'removal');
    expect(session.getSnapshot().rows[0].file).toBe('good.txt');
    expect(await db.getResult(session.getSnapshot().rows[0].key)).toBeDefined();
    cleanup();
    db.close();
  });

  it('jump-to-name opens the matching spectrum; the full id and file are in the tooltip', async () => {
    const { session, db } = await batch(['night1/spec-3655-55240-0101.txt', 'night1/spec-3655-55240-0202.txt', 'night2/spec-4001-55500-0033.txt']);
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('/');
    const field = screen.getByLabelText('Jump to a spectrum by name');
    expect(document.activeElement).toBe(field);
    fireEvent.change(field, { target: { value: '4001' } });
    fireEvent.submit(field.closest('form')!);
    await screen.findByText('OBJ-night2/spec-4001-55500-0033.txt', { selector: 'h2' });
    const cell = screen.getByText('OBJ-night1/spec-3655-55240-0202.txt', { selector: '.c-id' });
    expect(cell.getAttribute('title')).toContain('night1/spec-3655-55240-0202.txt');
    fireEvent.change(field, { target: { value: 'no-such-thing' } });
    fireEvent.submit(field.closest('form')!);
    expect((await screen.findByTestId('jump-note')).textContent).toMatch(/No spectrum matches/);
    cleanup();
    db.close();
  });

  it('a file added again is not added twice, and the page says so', async () => {
    const { session, db } = await batch(['a.txt']);
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('b');
    const input = (await screen.findAllByTestId('file-input'))[0] as HTMLInputElement;
    fireEvent.change(input, { target: { files: [new File(['a.txt'], 'a.txt')] } });
    expect((await screen.findByTestId('intake-notices')).textContent).toMatch(/Already in the batch, not added again.*a\.txt/);
    expect(session.getSnapshot().rows).toHaveLength(1);
    cleanup();
    db.close();
  });
});

describe('bulk accept of a filtered view', () => {
  it('says how many, records each as a bulk step, and undoes the whole step but not a later hand decision', async () => {
    const grades: Record<string, 'high' | 'low'> = { 'a.txt': 'high', 'b.txt': 'low', 'c.txt': 'high', 'd.txt': 'high' };
    const { session, db } = await batch(Object.keys(grades), (f) => makeResult(f, { confidence: grades[f] }));
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    fireEvent.change(screen.getByLabelText('Filter'), { target: { value: 'unreviewedHigh' } });
    const expected = Object.values(grades).filter((g) => g === 'high').length;
    fireEvent.click(screen.getByTestId('bulk-accept'));
    expect(screen.getByTestId('bulk-count').textContent).toBe(String(expected));
    fireEvent.click(screen.getByTestId('bulk-confirm-accept'));
    await waitUntil(() => session.getSnapshot().rows.filter((r) => r.decision).length === expected, 'bulk decisions');
    const decided = session.getSnapshot().rows.filter((r) => r.decision);
    expect(decided.map((r) => r.file).sort()).toEqual(Object.keys(grades).filter((f) => grades[f] === 'high').sort());
    for (const r of decided) {
      expect(r.decision).toMatchObject({ state: 'accepted', howSet: 'auto', reviewer: 'Tester', z: r.summary!.z });
      expect(r.decision!.note).toMatch(/bulk/);
    }
    expect(session.getSnapshot().rows.find((r) => r.file === 'b.txt')!.decision).toBeUndefined();
    // A hand decision after the step is kept by its undo.
    const keyA = session.getSnapshot().rows.find((r) => r.file === 'a.txt')!.key;
    await act(() => session.decide(keyA, { ...session.row(keyA)!.decision!, state: 'rejected', z: null, zErr: null, decidedAt: '2030-01-01T00:00:00.000Z' }));
    fireEvent.click(await screen.findByTestId('bulk-undo'));
    await waitUntil(() => session.getSnapshot().rows.filter((r) => r.decision).length === 1, 'undo of the step');
    expect(session.row(keyA)!.decision!.state).toBe('rejected');
    cleanup();
    db.close();
  });
});

describe('sessions', () => {
  async function savedSessionText(): Promise<{ text: string; files: string[] }> {
    const { session, db } = await batch(['s1.txt', 's2.txt']);
    const key = session.getSnapshot().rows[0].key;
    await session.decide(key, (await import('./fixtures')).makeDecision('s1.txt', { flags: ['blend'] }));
    const text = await session.exportSession(false);
    db.close();
    return { text, files: ['s1.txt', 's2.txt'] };
  }

  it('the empty start page loads a session file, decisions and flags included', async () => {
    const { text } = await savedSessionText();
    const { session, db } = await makeSession();
    render(<App services={{ session, review: fakeReview() }} />);
    const input = (await screen.findByLabelText('Session file')) as HTMLInputElement;
    fireEvent.change(input, { target: { files: [new File([text], 'saved.json', { type: 'application/json' })] } });
    await waitUntil(() => session.getSnapshot().rows.length === 2, 'loaded rows');
    const decided = session.getSnapshot().rows.find((r) => r.decision)!;
    expect(decided.file).toBe('s1.txt');
    expect(flagsOf(decided.decision)).toEqual(['blend']);
    cleanup();
    db.close();
  });

  it('with spectra here, loading asks: merge keeps both, replace keeps only the file', async () => {
    const { text } = await savedSessionText();
    for (const mode of ['merge', 'replace'] as const) {
      const { session, db } = await batch(['here.txt']);
      render(<App services={{ session, review: fakeReview() }} />);
      await screen.findByText('200 px');
      press('b');
      const input = (await screen.findByLabelText('Session file')) as HTMLInputElement;
      fireEvent.change(input, { target: { files: [new File([text], 'saved.json', { type: 'application/json' })] } });
      const choice = await screen.findByTestId('import-choice');
      expect(session.getSnapshot().rows).toHaveLength(1); // nothing changes before the choice
      if (mode === 'replace') fireEvent.click(within(choice).getByTestId('load-replace'));
      fireEvent.click(within(choice).getByTestId('load-confirm'));
      const want = mode === 'merge' ? ['here.txt', 's1.txt', 's2.txt'] : ['s1.txt', 's2.txt'];
      const files = () => session.getSnapshot().rows.map((r) => r.file).sort().join(',');
      await waitUntil(() => files() === want.join(','), `${mode} result`);
      expect((await screen.findByTestId('load-status')).textContent).toMatch(mode === 'merge' ? /^Loaded/ : /^Replaced/);
      // The loaded decision came along either way.
      expect(session.getSnapshot().rows.find((r) => r.file === 's1.txt')!.decision).toBeDefined();
      cleanup();
      db.close();
    }
  });
});

describe('list width', () => {
  it('clampListWidth keeps room for the list and the review panel', async () => {
    const { clampListWidth } = await import('../../src/ui/workbench/Workbench');
    expect(clampListWidth(100, 1400)).toBe(280);
    expect(clampListWidth(700, 1400)).toBe(700);
    expect(clampListWidth(1300, 1400)).toBe(1400 - 480);
  });

  it('the splitter widens the list by keyboard, and the width is kept for the next page', async () => {
    const { session, db } = await batch(['a.txt']);
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    const splitter = screen.getByTestId('list-splitter');
    const body = splitter.parentElement!;
    Object.defineProperty(body, 'clientWidth', { value: 1400, configurable: true });
    fireEvent.keyDown(splitter, { key: 'ArrowRight' });
    fireEvent.keyDown(splitter, { key: 'ArrowRight' });
    const w = Number(splitter.getAttribute('aria-valuenow'));
    expect(w).toBeGreaterThan(280);
    expect(body.style.getPropertyValue('--list-width')).toBe(`${w}px`);
    await waitUntil(() => session.savedView()?.listWidthPx === w, 'width saved');
    cleanup();
    db.close();
  });
});
