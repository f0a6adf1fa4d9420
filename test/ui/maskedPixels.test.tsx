// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, cleanup } from '@testing-library/react';
import { fakeReview, makeSession, waitUntil, ScriptedFitter } from './harness';
import { textBytes, makeResult, makeCandidate } from './fixtures';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');

afterEach(cleanup);

describe('review header', () => {
  it('says which input pixels the engine masked before the fit, in plain words', async () => {
    const made = await makeSession(undefined, new ScriptedFitter((file) =>
      makeResult(file, {
        candidates: [makeCandidate(0.5, 'galaxy', 0)],
        masked: file === 'a.txt' ? [{ reason: 'edge', pixels: 20 }, { reason: 'identical-run', pixels: 25 }] : undefined,
      }),
    ));
    await made.session.setReviewer('Tester');
    await made.session.addFiles([{ path: 'a.txt', bytes: textBytes('a') }]);
    await waitUntil(() => made.session.getSnapshot().rows.every((r) => r.status === 'ok'), 'fits');
    render(<App services={{ session: made.session, review: fakeReview() }} />);
    const line = await screen.findByTestId('review-masked');
    expect(line.textContent).toBe('masked before the fit: 20 at the ends, 25 in runs of one repeated value');
  });
});
