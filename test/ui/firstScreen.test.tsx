// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup, within } from '@testing-library/react';
import { fakeReview, makeSession, ScriptedFitter, waitUntil } from './harness';
import { makeResult, makeFailed } from './fixtures';
import { readSpectrum } from '../../src/core/io/readSpectrum';
import { SpectrumReadError } from '../../src/core/types';

vi.mock('../../src/ui/plots', () => import('./plotsStub'));
const { App } = await import('../../src/ui/App');

afterEach(cleanup);

/** A fitter that really reads the file (core reader) and stands in for the fit. */
const readingFitter = new ScriptedFitter((file, bytes) => {
  try {
    const s = readSpectrum(bytes, file);
    const n = s.wavelengthA.length;
    return makeResult(file, { input: { nPix: n, lambdaMinA: s.wavelengthA[0], lambdaMaxA: s.wavelengthA[n - 1], medianSnr: NaN, meta: s.meta, format: s.format } });
  } catch (e) {
    return makeFailed(file, e instanceof SpectrumReadError ? e.message : String(e));
  }
});

/** 101 pixels, 4000 to 5000 Angstrom, a plain two-column text spectrum. */
function csvSpectrum(): string {
  const lines = ['wavelength,flux'];
  for (let i = 0; i <= 100; i++) lines.push(`${4000 + 10 * i},${(1 + 0.01 * i).toFixed(3)}`);
  return lines.join('\n') + '\n';
}

function rowOf(text: string): HTMLElement {
  return screen.getByText(text, { selector: '.c-id' }).closest('[role=row]') as HTMLElement;
}

describe('first screen', () => {
  it('a picked file appears in the list with its pixel count and wavelength range', async () => {
    const { session, db } = await makeSession(undefined, readingFitter);
    render(<App services={{ session, review: fakeReview() }} />);
    const input = (await screen.findByTestId('file-input')) as HTMLInputElement;
    expect(screen.getByRole('button', { name: 'Load the demo set' })).toBeTruthy();
    const file = new File([csvSpectrum()], 'night1-obj07.csv', { type: 'text/csv' });
    fireEvent.change(input, { target: { files: [file] } });
    await screen.findByTestId('spectrum-list');
    await waitUntil(() => session.getSnapshot().rows[0]?.status === 'ok', 'fit');
    const row = await screen.findByText('· 101 px').then((el) => el.closest('[role=row]') as HTMLElement);
    expect(within(row).getByText('4000–5000 Å')).toBeTruthy();
    db.close();
  });

  it('a dropped folder is walked, and a broken file shows its read error as text', async () => {
    const { session, db } = await makeSession(undefined, readingFitter);
    render(<App services={{ session, review: fakeReview() }} />);
    const zone = await screen.findByTestId('drop-zone');
    const good = new File([csvSpectrum()], 'good.csv');
    const bad = new File(['<script>alert(1)</script>'], 'bad.csv');
    // A folder as the entry API gives it: a directory whose reader answers once, then with an empty batch.
    const fileEntry = (f: File, path: string) => ({ isFile: true, isDirectory: false, name: f.name, fullPath: path, file: (ok: (f: File) => void) => ok(f) });
    const batches = [[fileEntry(good, '/night1/good.csv'), fileEntry(bad, '/night1/bad.csv')], []];
    const dir = { isFile: false, isDirectory: true, name: 'night1', fullPath: '/night1', createReader: () => ({ readEntries: (ok: (b: unknown[]) => void) => ok(batches.shift() ?? []) }) };
    fireEvent.drop(zone, { dataTransfer: { items: [{ kind: 'file', webkitGetAsEntry: () => dir, getAsFile: () => null }], files: [] } });
    await waitUntil(() => session.getSnapshot().rows.length === 2 && session.getSnapshot().rows.every((r) => r.summary), 'both fitted');
    await screen.findByTestId('spectrum-list');
    // Folder paths are kept; files come in name order.
    expect(session.getSnapshot().rows.map((r) => r.file)).toEqual(['night1/bad.csv', 'night1/good.csv']);
    const badRow = await screen.findByText('bad.csv', { selector: '.c-id' }).then((el) => el.closest('[role=row]') as HTMLElement);
    expect(within(badRow).getByLabelText('read or fit error')).toBeTruthy();
    const err = badRow.querySelector('.row-error')!;
    expect(err.textContent).toMatch(/^night1\/bad\.csv/);
    expect(badRow.querySelector('script')).toBeNull();
    expect(within(rowOf('good.csv')).getByText('4000–5000 Å')).toBeTruthy();
    db.close();
  });

  it('the demo button fetches the index and every file relative to the page', async () => {
    const { session, db } = await makeSession(undefined, readingFitter);
    const asked: string[] = [];
    const fetchFn = vi.fn(async (url: string) => {
      asked.push(url);
      if (url.endsWith('index.json')) return new Response(JSON.stringify({ files: ['qso-01.csv', 'broken/empty.csv'] }));
      if (url.endsWith('empty.csv')) return new Response('');
      return new Response(csvSpectrum());
    }) as unknown as typeof fetch;
    render(<App services={{ session, review: fakeReview() }} fetchFn={fetchFn} />);
    fireEvent.click(await screen.findByTestId('load-demo'));
    await waitUntil(() => session.getSnapshot().rows.length === 2 && session.getSnapshot().rows.every((r) => r.summary), 'demo fitted');
    expect(asked.sort()).toEqual(['./sample-spectra/broken/empty.csv', './sample-spectra/index.json', './sample-spectra/qso-01.csv']);
    expect(session.getSnapshot().rows.find((r) => r.file.endsWith('empty.csv'))?.status).toBe('failed');
    db.close();
  });

  it('?demo loads the demo set at once', async () => {
    const { session, db } = await makeSession(undefined, readingFitter);
    const fetchFn = vi.fn(async (url: string) =>
      url.endsWith('index.json') ? new Response(JSON.stringify({ files: ['a.csv'] })) : new Response(csvSpectrum()),
    ) as unknown as typeof fetch;
    render(<App services={{ session, review: fakeReview() }} fetchFn={fetchFn} autoDemo />);
    await waitUntil(() => session.getSnapshot().rows.length === 1, 'demo row');
    expect(session.getSnapshot().rows[0].file).toBe('sample-spectra/a.csv');
    db.close();
  });

  it('shows done, failed and waiting counts', async () => {
    const { session, db } = await makeSession(undefined, readingFitter);
    render(<App services={{ session, review: fakeReview() }} />);
    const input = (await screen.findByTestId('file-input')) as HTMLInputElement;
    fireEvent.change(input, { target: { files: [new File([csvSpectrum()], 'a.csv'), new File(['x'], 'b.csv')] } });
    await waitUntil(() => session.getSnapshot().rows.length === 2 && !session.getSnapshot().progress.active, 'run over');
    await screen.findByText('1 failed');
    expect(screen.getByTestId('count-done').textContent).toBe('1 done');
    expect(screen.getByTestId('count-waiting').textContent).toBe('0 waiting');
    db.close();
  });
});
