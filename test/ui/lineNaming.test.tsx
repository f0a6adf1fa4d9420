// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup, act, within } from '@testing-library/react';
import { LineNamingList, rankSuggestions } from '../../src/ui/review/LineNamingList';
import type { LineSuggestion } from '../../src/core/engine/identify';
import type { FeatureAnswer } from '../../src/worker/fitWorkerApi';
import { fakeReview, makeSession, waitUntil } from './harness';
import { textBytes, makeResult } from './fixtures';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');

afterEach(cleanup);

// Invented suggestions for a feature at 5000 A: z = 5000 / rest - 1 (the definition of redshift).
const suggestions: LineSuggestion[] = [
  { lineId: 'OII', label: '[O II]', restA: 3728.48, z: 5000 / 3728.48 - 1, supporting: 1, supportingIds: ['NeIII'] },
  { lineId: 'MgII', label: 'Mg II', restA: 2798.75, z: 5000 / 2798.75 - 1, supporting: 3, supportingIds: ['CIII', 'CIV', 'Hbeta'] },
  { lineId: 'Hbeta', label: 'H\u03b2', restA: 4862.68, z: 5000 / 4862.68 - 1, supporting: 0, supportingIds: [] },
  { lineId: 'CIII', label: 'C III]', restA: 1908.73, z: 5000 / 1908.73 - 1, supporting: 1, supportingIds: ['CIV'] },
];
const answer: FeatureAnswer = { feature: { centreA: 5000.4, centreErrA: 0.6, kind: 'emission', snr: 12, fwhmA: 30 }, suggestions };

describe('LineNamingList', () => {
  it('lists suggestions best first: most supporting lines, engine order among equals', () => {
    expect(rankSuggestions(suggestions).map((s) => s.lineId)).toEqual(['MgII', 'OII', 'CIII', 'Hbeta']);
    render(<LineNamingList answer={answer} onChoose={() => {}} onClose={() => {}} />);
    const options = screen.getAllByTestId('line-option');
    expect(options.map((o) => o.querySelector('.opt-label')!.textContent)).toEqual(['Mg II', '[O II]', 'C III]', 'H\u03b2']);
    expect(options[0].textContent).toContain('z = 0.7865');
    expect(options[0].textContent).toContain('quick check: 3 other lines found');
    expect(options[3].textContent).toContain('quick check: no other line found');
  });

  it('with the fit curves, puts the line whose redshift the templates fit best first', () => {
    // Invented curve: the fit is best (delta chi2 0) at the Mg II redshift, 400 elsewhere.
    const zMg = 5000 / 2798.75 - 1;
    const z = Float64Array.from({ length: 601 }, (_, i) => i * 0.01);
    const curves = [{ family: 'qso', z, deltaChi2: z.map((v) => (Math.abs(v - zMg) < 0.02 ? 0 : 400)) }];
    const ranked = rankSuggestions([suggestions[0], suggestions[2], suggestions[1]], curves);
    expect(ranked[0].lineId).toBe('MgII');
    expect(ranked[0].fitDeltaChi2).toBeLessThan(ranked[1].fitDeltaChi2);
  });

  it('a number key or arrows and Enter choose a line', () => {
    const onChoose = vi.fn();
    render(<LineNamingList answer={answer} onChoose={onChoose} onClose={() => {}} />);
    const list = screen.getByRole('listbox', { name: 'Possible lines' });
    expect(document.activeElement).toBe(list);
    fireEvent.keyDown(list, { key: '2' });
    expect(onChoose).toHaveBeenLastCalledWith(expect.objectContaining(suggestions[0]));
    fireEvent.keyDown(list, { key: 'ArrowDown' });
    fireEvent.keyDown(list, { key: 'ArrowDown' });
    fireEvent.keyDown(list, { key: 'Enter' });
    expect(onChoose).toHaveBeenLastCalledWith(expect.objectContaining(suggestions[3]));
  });

  it('says so when no feature was found', () => {
    render(<LineNamingList answer={{ feature: null, suggestions: [] }} onChoose={() => {}} onClose={() => {}} />);
    expect(screen.getByText(/No clear feature there/)).toBeTruthy();
  });
});

describe('naming a line in the review panel', () => {
  it('click a feature -> worker locates it -> choose a line -> z is exactly that line\'s, recorded with the line and its observed wavelength', async () => {
    const { session, db } = await makeSession();
    await session.setReviewer('Tester');
    await session.addFiles([{ path: 'q.txt', bytes: textBytes('q') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    const review = fakeReview({
      nameFeature: vi.fn(async () => answer),
      refitNear: vi.fn(async (_k: string, z: number) => makeResult('q.txt', { z: z + 0.0002, zErr: 0.0003, class: 'qso' })),
    });
    render(<App services={{ session, review }} />);
    fireEvent.click(await screen.findByText('click feature at 5000'));
    const list = await screen.findByRole('listbox', { name: 'Possible lines' });
    expect(review.nameFeature).toHaveBeenCalledWith(expect.any(String), 5000);
    fireEvent.click(within(list).getByText('Mg II'));
    await screen.findByText(/line Mg II at 5000\.4/);
    // No refit behind the reviewer's back: z is the line's own, observed / rest - 1 (the definition of redshift).
    expect(review.refitNear).not.toHaveBeenCalled();
    const lineZ = answer.feature!.centreA / suggestions[1].restA - 1;
    expect(Number(screen.getByTestId('solution-z').textContent)).toBeCloseTo(lineZ, 5);
    act(() => void fireEvent.keyDown(window, { key: 'a' }));
    await waitUntil(() => !!session.getSnapshot().rows[0].decision, 'decision');
    const d = session.getSnapshot().rows[0].decision!;
    expect(d).toMatchObject({ state: 'changed', howSet: 'line', lineId: { id: 'MgII', observedA: 5000.4 } });
    expect(d.z).toBe(lineZ);
    // The error is the centre's, carried to z: sigma_z = sigma_observed / rest.
    expect(d.zErr).toBeCloseTo(answer.feature!.centreErrA / suggestions[1].restA, 12);
    db.close();
  });

  it('refining after naming a line is a separate step (r) that says how far z moved', async () => {
    const { session, db } = await makeSession();
    await session.addFiles([{ path: 'q.txt', bytes: textBytes('q') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    const review = fakeReview({
      nameFeature: vi.fn(async () => answer),
      refitNear: vi.fn(async (_k: string, z: number) => makeResult('q.txt', { z: z + 0.002, zErr: 0.0003, class: 'qso' })),
    });
    render(<App services={{ session, review }} />);
    fireEvent.click(await screen.findByText('click feature at 5000'));
    fireEvent.click(within(await screen.findByRole('listbox', { name: 'Possible lines' })).getByText('Mg II'));
    await screen.findByText(/line Mg II at 5000\.4/);
    const lineZ = answer.feature!.centreA / suggestions[1].restA - 1;
    act(() => void fireEvent.keyDown(window, { key: 'r' }));
    const moved = await screen.findByTestId('refined-from');
    expect(review.refitNear).toHaveBeenCalledWith(expect.any(String), lineZ);
    expect(moved.textContent).toContain('moved +0.00200');
    expect(screen.getByTestId('solution').textContent).toContain('refit near line Mg II');
    expect(Number(screen.getByTestId('solution-z').textContent)).toBeCloseTo(lineZ + 0.002, 5);
    db.close();
  });

  it('l puts the keyboard on the wavelength field; Enter there names the feature', async () => {
    const { session, db } = await makeSession();
    await session.addFiles([{ path: 'q.txt', bytes: textBytes('q') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    const review = fakeReview({ nameFeature: vi.fn(async () => answer) });
    render(<App services={{ session, review }} />);
    await screen.findByText('200 px');
    act(() => void fireEvent.keyDown(window, { key: 'l' }));
    const field = screen.getByLabelText('Observed wavelength of a feature (Å)');
    expect(document.activeElement).toBe(field);
    fireEvent.change(field, { target: { value: '6123.5' } });
    fireEvent.submit(field.closest('form')!);
    await screen.findByRole('listbox', { name: 'Possible lines' });
    expect(review.nameFeature).toHaveBeenCalledWith(expect.any(String), 6123.5);
    db.close();
  });
});
