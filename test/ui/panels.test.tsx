// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup, within, act } from '@testing-library/react';
import { KEY_MAP } from '../../src/ui/keys/keyMap';
import { PLOT_KEYS } from '../../src/ui/plots/viewActions';
import { fakeReview, makeSession, waitUntil } from './harness';
import { textBytes, makeDecision } from './fixtures';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');
const { HelpOverlay } = await import('../../src/ui/panels/HelpOverlay');

afterEach(cleanup);

describe('help overlay', () => {
  it('lists every workbench key and every plot key', () => {
    render(<HelpOverlay onClose={() => {}} />);
    const keys = screen.getByRole('table', { name: 'Workbench keys' });
    for (const b of KEY_MAP) expect(within(keys).getByText(b.label)).toBeTruthy();
    const plot = screen.getByRole('table', { name: 'Plot keys' });
    for (const p of PLOT_KEYS) expect(within(plot).getByText(p.action)).toBeTruthy();
  });

  it('? opens and closes it, Escape closes it', async () => {
    const { session, db } = await makeSession();
    await session.addFiles([{ path: 'a.txt', bytes: textBytes('a') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByTestId('review-panel');
    act(() => void fireEvent.keyDown(window, { key: '?' }));
    expect(screen.getByTestId('help-overlay')).toBeTruthy();
    act(() => void fireEvent.keyDown(window, { key: '?' }));
    expect(screen.queryByTestId('help-overlay')).toBeNull();
    act(() => void fireEvent.keyDown(window, { key: '?' }));
    fireEvent.keyDown(screen.getByTestId('help-overlay'), { key: 'Escape' });
    expect(screen.queryByTestId('help-overlay')).toBeNull();
    db.close();
  });
});

describe('storage failure', () => {
  it('a refused write shows the banner with an immediate export', async () => {
    const { session, db } = await makeSession();
    await session.setReviewer('Tester');
    const [key] = await session.addFiles([{ path: 'a.txt', bytes: textBytes('a') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByTestId('review-panel');
    const quota = new DOMException('The quota has been exceeded.', 'QuotaExceededError');
    (db as unknown as { db: { put: () => Promise<never> } }).db.put = () => Promise.reject(quota);
    await act(async () => {
      await session.decide(key, makeDecision('a.txt')).catch(() => undefined);
    });
    const banner = await screen.findByTestId('persist-banner');
    expect(banner.textContent).toMatch(/storage quota is full/);
    expect(within(banner).getByRole('button', { name: 'Export session now' })).toBeTruthy();
    db.close();
  });
});

describe('cosmology panel', () => {
  it('states the defaults, refuses an unphysical model and keeps a valid one', async () => {
    const { session, db } = await makeSession();
    await session.addFiles([{ path: 'a.txt', bytes: textBytes('a') }]);
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    render(<App services={{ session, review: fakeReview() }} />);
    await screen.findByTestId('review-panel');
    act(() => void fireEvent.keyDown(window, { key: 'c' }));
    const panel = screen.getByTestId('cosmology-panel');
    expect(panel.textContent).toMatch(/Defaults: flat Lambda-CDM: H0 = 70 km\/s\/Mpc, Omega_m = 0.3/);
    fireEvent.change(within(panel).getByLabelText('H0 (km/s/Mpc)'), { target: { value: '-5' } });
    expect(within(panel).getByRole('alert').textContent).toMatch(/H0 must be a positive number/);
    fireEvent.change(within(panel).getByLabelText('H0 (km/s/Mpc)'), { target: { value: '67.7' } });
    fireEvent.click(within(panel).getByText('Use this cosmology'));
    await waitUntil(() => session.getSnapshot().cosmology.h0 === 67.7, 'cosmology saved');
    expect(await db.getSetting('cosmology')).toMatchObject({ h0: 67.7 });
    db.close();
  });
});
