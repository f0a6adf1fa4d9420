/**
 * The line table: one row per spectrum and measured line (FitResult.lines, at
 * the automatic solution). The command line and the browser both build these
 * rows here, so a line row is byte-identical wherever it is made. `file` ties a
 * row to its catalogue row.
 */
import type { FitResult } from '../types';
import type { ColumnDef, TableRow } from './columns';
import { formatCell, type CellValue } from './formatCell';

export const LINE_COLUMNS: readonly ColumnDef[] = [
  { name: 'file', unit: '', type: 'text', group: 'automatic', ucd: 'meta.id;meta.dataset', description: 'Spectrum file name as in the catalogue' },
  { name: 'line_id', unit: '', type: 'text', group: 'automatic', ucd: 'meta.id', description: 'Catalogue line id' },
  { name: 'label', unit: '', type: 'text', group: 'automatic', description: 'Line name as shown' },
  { name: 'kind', unit: '', type: 'text', group: 'automatic', description: 'emission or absorption' },
  { name: 'rest_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', ucd: 'em.wl', description: 'Rest-frame vacuum wavelength of the line' },
  { name: 'observed_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', ucd: 'em.wl', description: 'Fitted observed vacuum wavelength of the line centre' },
  { name: 'observed_err_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', ucd: 'stat.error;em.wl', description: '1-sigma error of observed_a' },
  { name: 'z', unit: '', type: 'float', decimals: 6, group: 'automatic', ucd: 'src.redshift', description: 'Redshift implied by this line alone' },
  { name: 'z_err', unit: '', type: 'float', decimals: 6, group: 'automatic', ucd: 'stat.error;src.redshift', description: '1-sigma error of z' },
  { name: 'fwhm_kms', unit: 'km/s', type: 'float', decimals: 1, group: 'automatic', description: 'Full width at half maximum of the fitted Gaussian' },
  { name: 'fwhm_err_kms', unit: 'km/s', type: 'float', decimals: 1, group: 'automatic', description: '1-sigma error of fwhm_kms' },
  { name: 'flux', unit: '', type: 'float', significant: 6, group: 'automatic', description: 'Integrated line flux in flux_unit times Angstrom; negative for absorption' },
  { name: 'flux_err', unit: '', type: 'float', significant: 6, group: 'automatic', description: '1-sigma error of flux' },
  { name: 'flux_unit', unit: '', type: 'text', group: 'automatic', description: "The spectrum's flux density unit as read from the file (empty when unknown)" },
  { name: 'ew_rest_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', description: 'Rest-frame equivalent width, positive for emission' },
  { name: 'ew_rest_err_a', unit: 'Angstrom', type: 'float', decimals: 3, group: 'automatic', description: '1-sigma error of ew_rest_a' },
  { name: 'snr', unit: '', type: 'float', decimals: 2, group: 'automatic', description: 'Signal-to-noise ratio of the line flux' },
  { name: 'detected', unit: '', type: 'bool', group: 'automatic', description: 'true when the line is detected at snr >= 3 with a physical width' },
];

/** The line rows of one fit, in the fit's line order; none for a failed fit. */
export function lineRows(result: FitResult): TableRow[] {
  if (result.status !== 'ok') return [];
  return (result.lines ?? []).map((l) => {
    const v: Record<string, CellValue> = {
      file: result.file,
      line_id: l.id,
      label: l.label,
      kind: l.kind,
      rest_a: l.restA,
      observed_a: l.observedA,
      observed_err_a: l.observedErrA,
      z: l.z,
      z_err: l.zErr,
      fwhm_kms: l.fwhmKms,
      fwhm_err_kms: l.fwhmErrKms,
      flux: l.flux,
      flux_err: l.fluxErr,
      flux_unit: result.input?.meta?.fluxUnit ?? '',
      ew_rest_a: l.ewRestA,
      ew_rest_err_a: l.ewRestErrA,
      snr: l.snr,
      detected: l.detected,
    };
    const row: Record<string, string> = {};
    for (const c of LINE_COLUMNS) row[c.name] = formatCell(c, v[c.name]);
    return row;
  });
}
