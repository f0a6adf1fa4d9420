// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup, act, within } from '@testing-library/react';
import { fakeReview, makeSession, waitUntil, ScriptedFitter } from './harness';
import { textBytes, makeResult, makeCandidate } from './fixtures';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');
const { SessionDb } = await import('../../src/ui/persist/sessionDb');
const { Session } = await import('../../src/ui/state/session');

afterEach(cleanup);

async function threeFiles(reviewer: string | null = 'Tester') {
  const made = await makeSession(undefined, new ScriptedFitter((file) =>
    makeResult(file, { candidates: [makeCandidate(1.2, 'qso', 0), makeCandidate(0.35, 'galaxy', 40)] }),
  ));
  if (reviewer) await made.session.setReviewer(reviewer);
  await made.session.addFiles([
    { path: 'a.txt', bytes: textBytes('a') },
    { path: 'b.txt', bytes: textBytes('b') },
    { path: 'c.txt', bytes: textBytes('c') },
  ]);
  await waitUntil(() => made.session.getSnapshot().rows.every((r) => r.status === 'ok'), 'fits');
  return made;
}

const title = () => screen.getByTestId('review-title').textContent;
const press = (key: string) => act(() => void fireEvent.keyDown(window, { key }));

describe('decision flow', () => {
  it('keyboard accept stores the decision and opens the next unreviewed spectrum; a remount restores it', async () => {
    const { session, db, name } = await threeFiles();
    const review = fakeReview();
    const { unmount } = render(<App services={{ session, review }} />);
    await screen.findByTestId('review-panel');
    expect(title()).toBe('OBJ-a.txt');
    // The automatic redshift is labelled as unreviewed before any decision.
    expect((await screen.findByTestId('unreviewed-caution')).textContent).toMatch(/not reviewed/);
    await screen.findByText('200 px');
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    await screen.findByText('OBJ-b.txt', { selector: 'h2' });
    const d = session.getSnapshot().rows[0].decision!;
    expect(d).toMatchObject({ state: 'accepted', z: 1.2, howSet: 'auto', reviewer: 'Tester', class: 'qso' });
    unmount();
    db.close();

    const db2 = await SessionDb.open(name);
    const s2 = new Session(db2, new ScriptedFitter());
    render(<App services={{ session: s2, review }} />);
    await screen.findByTestId('review-panel');
    const rowA = screen.getByText('OBJ-a.txt', { selector: '.c-id' }).closest('[role=row]') as HTMLElement;
    expect(within(rowA).getByText(/accepted/)).toBeTruthy();
    // The first unreviewed spectrum opens after a reload.
    expect(title()).toBe('OBJ-b.txt');
    db2.close();
  });

  it('key 2 shows the second candidate and accepting it records a change', async () => {
    const { session, db } = await threeFiles();
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('2');
    await screen.findByText('candidate 2', { exact: false });
    expect(screen.getByTestId('solution-z').textContent).toBe('0.35000');
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    expect(session.getSnapshot().rows[0].decision).toMatchObject({ state: 'changed', z: 0.35, howSet: 'candidate', class: 'galaxy' });
    db.close();
  });

  it('x rejects as unusable with no redshift, and g sets the reviewer grade first', async () => {
    const { session, db } = await threeFiles();
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('g'); // unset -> high
    press('g'); // high -> medium
    press('x');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    expect(session.getSnapshot().rows[0].decision).toMatchObject({ state: 'rejected', z: null, reviewerGrade: 'medium' });
    db.close();
  });

  it('asks the reviewer name once before the first decision', async () => {
    const { session, db } = await threeFiles(null);
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByText('200 px');
    press('a');
    const dialog = await screen.findByTestId('reviewer-dialog');
    fireEvent.change(within(dialog).getByLabelText('Reviewer name'), { target: { value: 'Night Owl' } });
    fireEvent.click(within(dialog).getByText('Save and continue'));
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    expect(session.getSnapshot().rows[0].decision?.reviewer).toBe('Night Owl');
    expect(await db.getSetting('reviewer')).toBe('Night Owl');
    db.close();
  });

  it('a typed redshift is refined by the worker and kept as typed', async () => {
    const { session, db } = await threeFiles();
    const review = fakeReview();
    render(<App services={{ session, review }} />);
    await screen.findByText('200 px');
    press('z');
    const input = screen.getByLabelText('Type a redshift');
    expect(document.activeElement).toBe(input);
    fireEvent.change(input, { target: { value: '0.8' } });
    fireEvent.submit(input.closest('form')!);
    await screen.findByText('typed redshift', { exact: false });
    expect(review.refitNear).toHaveBeenCalledWith(expect.any(String), 0.8);
    press('a');
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    expect(session.getSnapshot().rows[0].decision).toMatchObject({ state: 'changed', howSet: 'typed', z: 0.8001, class: 'galaxy' });
    db.close();
  });

  it('j and k move the current row; ? opens the key list', async () => {
    const { session, db } = await threeFiles();
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByTestId('review-panel');
    press('j');
    await screen.findByText('OBJ-b.txt', { selector: 'h2' });
    press('k');
    await screen.findByText('OBJ-a.txt', { selector: 'h2' });
    press('?');
    const help = await screen.findByTestId('help-overlay');
    expect(within(help).getByText('Reject as unusable and open the next unreviewed')).toBeTruthy();
    db.close();
  });
});
