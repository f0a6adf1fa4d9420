// @vitest-environment jsdom
import { describe, it, expect, afterEach, vi } from 'vitest';
import { render, screen, fireEvent, cleanup } from '@testing-library/react';
import { SpectrumList, visibleRange, ROW_HEIGHT_PX, OVERSCAN_ROWS } from '../../../src/ui/list/SpectrumList';
import type { Row } from '../../../src/ui/state/session';
import { summarise } from '../../../src/ui/persist/resultSummary';
import { makeResult, makeFailed } from '../fixtures';

afterEach(cleanup);

function manyRows(n: number): Row[] {
  const base = summarise(makeResult('x'));
  return Array.from({ length: n }, (_, i) => ({
    key: `k${i}`,
    file: `spec-${i}.fits`,
    order: i,
    hasBytes: true,
    status: 'ok' as const,
    summary: { ...base, objectId: `OBJ-${i}`, z: i / 1000 },
  }));
}

describe('SpectrumList', () => {
  it('renders a bounded number of rows for 10,000 spectra', () => {
    render(<SpectrumList rows={manyRows(10_000)} currentKey={null} onSelect={() => {}} />);
    const drawn = screen.getAllByTestId('spectrum-row');
    // jsdom has no layout: the list uses its 520 px fallback viewport -> 20 rows + overscan.
    expect(drawn.length).toBeGreaterThan(0);
    expect(drawn.length).toBeLessThanOrEqual(Math.ceil(520 / ROW_HEIGHT_PX) + 2 * OVERSCAN_ROWS);
    expect(screen.getByRole('grid', { name: 'Spectra' }).getAttribute('aria-rowcount')).toBe('10001');
  });

  it('draws the rows at the scroll position', () => {
    render(<SpectrumList rows={manyRows(10_000)} currentKey={null} onSelect={() => {}} />);
    const body = screen.getByTestId('spectrum-list-body');
    body.scrollTop = 5000 * ROW_HEIGHT_PX;
    fireEvent.scroll(body);
    expect(screen.getByText('OBJ-5000')).toBeTruthy();
    expect(screen.queryByText('OBJ-0')).toBeNull();
  });

  it('brings the current row into view', () => {
    const rows = manyRows(10_000);
    render(<SpectrumList rows={rows} currentKey="k7777" onSelect={() => {}} />);
    const row = screen.getByText('OBJ-7777').closest('[role=row]')!;
    expect(row.getAttribute('aria-selected')).toBe('true');
  });

  it('clicking a row selects it', () => {
    const onSelect = vi.fn();
    render(<SpectrumList rows={manyRows(5)} currentKey={null} onSelect={onSelect} />);
    fireEvent.click(screen.getByText('OBJ-3'));
    expect(onSelect).toHaveBeenCalledWith('k3');
  });

  it('shows a read error as text with a warning mark, never as HTML', () => {
    const rows: Row[] = [
      { key: 'bad', file: 'broken.fits', order: 0, hasBytes: true, status: 'failed', summary: summarise(makeFailed('broken.fits', 'broken.fits: <b>missing END card</b>')) },
    ];
    const { container } = render(<SpectrumList rows={rows} currentKey={null} onSelect={() => {}} />);
    expect(screen.getByText('broken.fits: <b>missing END card</b>')).toBeTruthy();
    expect(container.querySelector('b')).toBeNull();
    expect(screen.getByLabelText('read or fit error').textContent).toBe('⚠');
  });

  it('visibleRange clips to the list', () => {
    expect(visibleRange(0, 100, 3)).toEqual([0, 3]);
    expect(visibleRange(1000 * ROW_HEIGHT_PX, 10 * ROW_HEIGHT_PX, 10_000, ROW_HEIGHT_PX, 2)).toEqual([998, 1012]);
  });
});
