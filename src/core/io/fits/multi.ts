/**
 * Over 400 lines on purpose: both multi-spectrum layouts share the fibre-table
 * reading, id rules and per-row error handling, which would only be passed
 * around if split.
 *
 * Files holding many spectra: one per fibre, slit or object. Two layouts:
 *
 * - Image rows. A 2-D image whose rows are spectra on one wavelength axis
 *   (NAXIS1 pixels by NAXIS2 spectra), recognised by a companion image of the
 *   same shape named for an uncertainty, mask or wavelength (EXTNAME), by a
 *   fibre table with one row per image row, or by aperture keywords (APID1 /
 *   APNUM1). Or a 3-D image (pixels x spectra x planes) whose planes are flux,
 *   uncertainty and mask, named by BANDIDn or taken in that order. A 2-D image
 *   whose rows EXTEN0 or BANDIDn describe (flux, inverse variance, ...) is one
 *   spectrum and is left to the single-spectrum reader.
 * - Table rows. A binary table of more than one row whose flux column holds an
 *   array (TFORM rE, r > 1): one object per row, with wavelength, uncertainty
 *   and mask array columns, or one wavelength axis in the header.
 *
 * Object ids, positions and fibre types come from scalar columns of the table
 * itself or of a fibre table (a binary table with one row per spectrum and
 * columns such as OBJECT, TARGETID, OBJTYPE, RA, DEC). Rows whose type says
 * sky, unused, broken or the like are dropped. The 1-based row number stays
 * each spectrum's index, so ids do not shift when rows are dropped.
 */
import { assembleSpectrum, checkPixelCount } from '../assemble';
import { airToVacuumInPlace } from '../airVacuum';
import { SpectrumReadError, type Spectrum, type SpectrumMeta } from '../../types';
import type { FitsHdu } from './hdus';
import type { FitsHeader } from './header';
import { guessNoiseKind, imageRow } from './image';
import { metaFromHeaders } from './meta';
import { isUncertainty, normaliseName, roleOf, toInverseVariance, type Role } from './names';
import { columnWavelengthsToAngstrom, isNumeric, NUMERIC_BITPIX, tableColumns, type TableColumn } from './table';
import { decodeValues } from './decode';
import { headerSaysAir, spectralAxis } from './wcs';

/** Most spectra read from one file. A 512 MiB file of 100-pixel float32 rows holds ~1.3 million; that is not a plate. */
export const MAX_SPECTRA_PER_FILE = 100_000;

/** One spectrum of a multi-object file, read on demand so that a bad row fails alone. */
export interface MultiRow {
  /** 1-based row (fibre, object) number in the file. */
  index: number;
  read(id: string): Spectrum;
  /** What the fibre or object table says of the row (id, position), known even when its data cannot be read. */
  facts?: { objectId?: string; raDeg?: number; decDeg?: number };
}

export interface MultiObjectFile {
  kind: 'image-rows' | 'table-rows';
  /** HDU holding the flux. */
  hdu: number;
  /** Rows in the file, kept or not. */
  rowCount: number;
  /** Kept rows, in file order. */
  rows: MultiRow[];
  /** Rows dropped because the fibre table marks them as sky, unused and so on. */
  dropped: { index: number; type: string }[];
}

/** Per-row facts from a fibre table or the table's own scalar columns. */
interface RowFacts {
  objectId?: string;
  raDeg?: number;
  decDeg?: number;
  type?: string;
}

// ---- names (compared after normaliseName: lower case, no blanks or punctuation) ----

const ID_COLUMNS = ['object', 'objname', 'objectname', 'objid', 'objectid', 'targetid', 'targid', 'target', 'targname', 'targetname', 'designation', 'desig', 'name', 'id'];
const TYPE_COLUMNS = ['objtype', 'objecttype', 'fibertype', 'fibretype', 'fibtype', 'targtype', 'targettype', 'fiberstatus', 'fibrestatus', 'type'];
const RA_COLUMNS = ['ra', 'raobj', 'objra', 'radeg', 'plugra', 'targetra', 'raj2000', 'fiberra', 'fibrera'];
const DEC_COLUMNS = ['dec', 'decobj', 'objdec', 'decdeg', 'plugdec', 'targetdec', 'dej2000', 'decj2000', 'fiberdec', 'fibredec'];
const FIBRE_COLUMNS = ['fiberid', 'fibreid', 'fiber', 'fibre', 'fibnum', 'fibernum', 'fibrenum', 'fiberno', 'fibreno', 'fibno'];
/** Fibre or object types that hold no target spectrum (common practice in fibre tables). */
const NOT_A_TARGET = new Set([
  'sky', 'skyfiber', 'skyfibre', 'blanksky', 'unused', 'unallocated', 'unassigned', 'notused', 'empty', 'none', 'parked', 'park',
  'broken', 'dead', 'blocked', 'disabled', 'bad', 'guide', 'guidefiber', 'guidefibre', 'fiducial',
]);

/** Why a row is dropped (its type), or undefined when it is kept. */
function dropReason(type: string | undefined): string | undefined {
  if (type === undefined) return undefined;
  const t = normaliseName(type);
  return NOT_A_TARGET.has(t) || t.startsWith('sky') ? type : undefined;
}

// ---- table cells ----

/** One cell of a scalar column as text: strings trimmed, 64-bit integers exact. */
function cellText(bytes: Uint8Array, hdu: FitsHdu, col: TableColumn, row: number): string | undefined {
  const at = hdu.dataOffset + row * hdu.axes[0] + col.offset;
  if (col.type === 'A') {
    let s = '';
    for (let i = 0; i < col.repeat; i++) {
      const c = bytes[at + i];
      if (c === 0) break;
      s += String.fromCharCode(c);
    }
    s = s.trim();
    return s === '' ? undefined : s;
  }
  if (col.type === 'K' && col.scale === 1 && col.zero === 0) {
    const v = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getBigInt64(at, false);
    return col.tnull !== undefined && BigInt(col.tnull) === v ? undefined : v.toString();
  }
  const v = cellNumber(bytes, hdu, col, row);
  return v === undefined ? undefined : String(v);
}

function cellNumber(bytes: Uint8Array, hdu: FitsHdu, col: TableColumn, row: number): number | undefined {
  if (!(col.type in NUMERIC_BITPIX)) return undefined;
  const scaling = { scale: col.scale, zero: col.zero, ...(col.tnull !== undefined ? { blank: col.tnull } : {}) };
  const v = decodeValues(bytes, hdu.dataOffset + row * hdu.axes[0] + col.offset, 1, NUMERIC_BITPIX[col.type], scaling)[0];
  return Number.isFinite(v) ? v : undefined;
}

/** The first scalar column whose name is in `names` (in the order of `names`). */
function scalarColumn(cols: readonly TableColumn[], names: readonly string[], numericOnly = false): TableColumn | undefined {
  for (const name of names) {
    const c = cols.find((k) => normaliseName(k.name) === name && k.repeat >= 1 && (k.type === 'A' ? !numericOnly : k.repeat === 1 && k.type in NUMERIC_BITPIX));
    if (c) return c;
  }
  return undefined;
}

/** True when the columns describe fibres or objects (at least an id, a type or a fibre number). */
function describesRows(cols: readonly TableColumn[]): boolean {
  return [ID_COLUMNS, TYPE_COLUMNS, FIBRE_COLUMNS].some((names) => scalarColumn(cols, names) !== undefined);
}

/** Facts for every row of a table from its scalar columns. */
function rowFacts(bytes: Uint8Array, hdu: FitsHdu, cols: readonly TableColumn[]): RowFacts[] {
  const id = scalarColumn(cols, ID_COLUMNS);
  const type = scalarColumn(cols, TYPE_COLUMNS.filter((n) => n !== 'fiberstatus' && n !== 'fibrestatus'));
  const ra = scalarColumn(cols, RA_COLUMNS, true);
  const dec = scalarColumn(cols, DEC_COLUMNS, true);
  const out: RowFacts[] = [];
  for (let r = 0; r < hdu.axes[1]; r++) {
    const f: RowFacts = {};
    if (id) f.objectId = cellText(bytes, hdu, id, r);
    if (type && type.type === 'A') f.type = cellText(bytes, hdu, type, r);
    const a = ra ? cellNumber(bytes, hdu, ra, r) : undefined;
    const d = dec ? cellNumber(bytes, hdu, dec, r) : undefined;
    if (a !== undefined && a >= 0 && a < 360) f.raDeg = a;
    if (d !== undefined && d >= -90 && d <= 90) f.decDeg = d;
    out.push(f);
  }
  return out;
}

/** Columns of a binary table, or null when its header is not a readable table (left to the single reader). */
function columnsOrNull(hdu: FitsHdu, file: string): TableColumn[] | null {
  try {
    return tableColumns(hdu, file);
  } catch (e) {
    if (e instanceof SpectrumReadError) return null;
    throw e;
  }
}

/** A fibre table: another binary table with `nRows` rows describing fibres or objects. */
function fibreTable(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[], nRows: number, exclude: number): RowFacts[] | null {
  for (const hdu of hdus) {
    if (hdu.index === exclude || hdu.kind !== 'bintable' || hdu.axes[1] !== nRows) continue;
    const cols = columnsOrNull(hdu, file);
    if (cols && describesRows(cols)) return rowFacts(bytes, hdu, cols);
  }
  return null;
}

/** Aperture ids from APIDn keywords (one per image row), or null. */
function apertureIds(h: FitsHeader, nRows: number): RowFacts[] | null {
  if (!h.has('APID1') && !h.has('APNUM1')) return null;
  const out: RowFacts[] = [];
  for (let i = 1; i <= nRows; i++) {
    const id = h.str(`APID${i}`);
    out.push(id ? { objectId: id } : {});
  }
  return out;
}

// ---- shared pieces of a row ----

interface SharedAxis {
  wavelengthA: Float64Array;
  /** The file gives air wavelengths (converted per row). */
  air: boolean;
}

/** Header metadata shared by every row: date, exposure, instrument, flux unit; not the field's OBJECT or pointing. */
function sharedMeta(headers: readonly FitsHeader[], fluxUnit?: string): SpectrumMeta {
  const meta = metaFromHeaders(headers, fluxUnit);
  delete meta.objectId;
  delete meta.raDeg;
  delete meta.decDeg;
  return meta;
}

/** Build one validated spectrum of a multi-object file. */
function assembleRow(
  id: string, format: string, hdu: number, wlIn: Float64Array, air: boolean,
  flux: Float64Array, ivar: Float64Array | null, mask: Uint8Array | undefined, meta: SpectrumMeta, facts: RowFacts | undefined,
): Spectrum {
  const wl = Float64Array.from(wlIn);
  if (air) airToVacuumInPlace(wl);
  if (wl.length > 1 && wl[0] > wl[wl.length - 1]) {
    wl.reverse();
    flux.reverse();
    ivar?.reverse();
    mask?.reverse();
  }
  const m: SpectrumMeta = { ...meta };
  if (facts?.objectId !== undefined) m.objectId = facts.objectId;
  if (facts?.raDeg !== undefined) m.raDeg = facts.raDeg;
  if (facts?.decDeg !== undefined) m.decDeg = facts.decDeg;
  if (air) m.convertedFromAir = true;
  return assembleSpectrum({ file: id, format, wavelengthA: wl, flux, ivar, mask, meta: m, where: { hdu } });
}

function toMask(values: Float64Array): Uint8Array {
  const m = new Uint8Array(values.length);
  for (let i = 0; i < values.length; i++) m[i] = values[i] === 0 ? 0 : 1;
  return m;
}

function isMaskLike(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (!(values[i] >= 0) || !Number.isInteger(values[i])) return false;
  return true;
}

function checkRowCount(file: string, n: number, where: { hdu: number; keyword: string }): void {
  if (n > MAX_SPECTRA_PER_FILE) {
    throw new SpectrumReadError(file, `holds ${n} spectra, more than the limit of ${MAX_SPECTRA_PER_FILE} per file`, where);
  }
}

/** Keep the rows the facts do not mark as sky, unused and so on. */
function keepRows(
  nRows: number, facts: RowFacts[] | null, make: (row: number) => MultiRow,
): { rows: MultiRow[]; dropped: { index: number; type: string }[] } {
  const rows: MultiRow[] = [];
  const dropped: { index: number; type: string }[] = [];
  for (let r = 0; r < nRows; r++) {
    const why = dropReason(facts?.[r]?.type);
    if (why !== undefined) dropped.push({ index: r + 1, type: why });
    else {
      const f = facts?.[r];
      rows.push(f ? { ...make(r), facts: { objectId: f.objectId, raDeg: f.raDeg, decDeg: f.decDeg } } : make(r));
    }
  }
  return { rows, dropped };
}

// ---- image rows ----

/** Axes beyond the first, without trailing 1s. */
function outerAxes(hdu: FitsHdu): number[] {
  const rest = hdu.axes.slice(1);
  while (rest.length && rest[rest.length - 1] === 1) rest.pop();
  return rest;
}

function sameShape(a: FitsHdu, nPix: number, nRows: number): boolean {
  const o = outerAxes(a);
  return a.kind === 'image' && a.axes[0] === nPix && o.length === 1 && o[0] === nRows;
}

function imageLayout(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[]): MultiObjectFile | null {
  for (const hdu of hdus) {
    if (hdu.kind !== 'image') continue;
    const role = roleOf(hdu.extname);
    if (role !== null && role !== 'flux') continue;
    const outer = outerAxes(hdu);
    if (outer.length === 2 && outer[0] > 1) return cubeLayout(bytes, file, hdus, hdu, outer[0], outer[1]);
    if (outer.length !== 1 || outer[0] < 2) continue;
    const nPix = hdu.axes[0];
    const nRows = outer[0];
    const h = hdu.header;
    // Rows described as flux, inverse variance, ... are one spectrum (image.ts).
    if (h.has('EXTEN0') || h.has('BANDID1') || h.has('BANDID2')) continue;
    const companions = hdus.filter((o) => o !== hdu && sameShape(o, nPix, nRows) && roleOf(o.extname) !== null && roleOf(o.extname) !== 'flux');
    const table = fibreTable(bytes, file, hdus, nRows, -1);
    const apertures = table ? null : apertureIds(h, nRows);
    if (companions.length === 0 && !table && !apertures) continue;
    return rowsOfImage(bytes, file, hdus, hdu, nPix, nRows, companions, table ?? apertures);
  }
  return null;
}

function sharedImageAxis(file: string, hdus: readonly FitsHdu[], hdu: FitsHdu, nPix: number, bytes: Uint8Array): SharedAxis | null {
  const h = hdu.header;
  const axis = spectralAxis(h, nPix, file, hdu.index) ?? (hdu.index > 0 ? spectralAxis(hdus[0].header, nPix, file, 0) : null);
  if (axis) return { wavelengthA: axis.wavelengthA, air: axis.air };
  // A 1-D wavelength image of the same length.
  const w = hdus.find((o) => o.kind === 'image' && o.axes[0] === nPix && outerAxes(o).length === 0 && isWaveRole(roleOf(o.extname)));
  if (!w) return null;
  const role = roleOf(w.extname)!;
  const wl = imageRow(bytes, w, 0, file);
  if (role === 'loglam') for (let i = 0; i < nPix; i++) wl[i] = 10 ** wl[i];
  return { wavelengthA: wl, air: role === 'wave-air' || headerSaysAir(h) };
}

const isWaveRole = (r: Role | null): r is 'wave' | 'loglam' | 'wave-air' => r === 'wave' || r === 'loglam' || r === 'wave-air';

function rowsOfImage(
  bytes: Uint8Array, file: string, hdus: readonly FitsHdu[], hdu: FitsHdu, nPix: number, nRows: number,
  companions: FitsHdu[], facts: RowFacts[] | null,
): MultiObjectFile {
  checkPixelCount(file, nPix, { hdu: hdu.index, keyword: 'NAXIS1' });
  checkRowCount(file, nRows, { hdu: hdu.index, keyword: 'NAXIS2' });
  const noise = companions.find((c) => isUncertainty(roleOf(c.extname)));
  const maskHdu = companions.find((c) => roleOf(c.extname) === 'mask') ?? (noise ? undefined : companions.find((c) => roleOf(c.extname) === 'bitmask'));
  const waveHdu = companions.find((c) => isWaveRole(roleOf(c.extname)));
  const shared = waveHdu ? null : sharedImageAxis(file, hdus, hdu, nPix, bytes);
  if (!waveHdu && !shared) {
    throw new SpectrumReadError(file, 'no wavelength axis for the spectra in the image rows: no spectral WCS, COEFF0/COEFF1 or wavelength image', {
      hdu: hdu.index,
      keyword: 'CTYPE1',
    });
  }
  const headers = hdu.index > 0 ? [hdu.header, hdus[0].header] : [hdu.header];
  const meta = sharedMeta(headers);
  const kept = keepRows(nRows, facts, (r) => ({
    index: r + 1,
    read: (id) => {
      const flux = imageRow(bytes, hdu, r, id);
      let ivar: Float64Array | null = null;
      if (noise) ivar = toInverseVariance(imageRow(bytes, noise, r, id), roleOf(noise.extname) as 'ivar' | 'variance' | 'error');
      const mask = maskHdu ? toMask(imageRow(bytes, maskHdu, r, id)) : undefined;
      let wl: Float64Array;
      let air: boolean;
      if (waveHdu) {
        wl = imageRow(bytes, waveHdu, r, id);
        const role = roleOf(waveHdu.extname);
        if (role === 'loglam') for (let i = 0; i < nPix; i++) wl[i] = 10 ** wl[i];
        air = role === 'wave-air' || headerSaysAir(hdu.header);
      } else {
        wl = shared!.wavelengthA;
        air = shared!.air;
      }
      return assembleRow(id, 'fits-image-rows', hdu.index, wl, air, flux, ivar, mask, meta, facts?.[r]);
    },
  }));
  return { kind: 'image-rows', hdu: hdu.index, rowCount: nRows, ...kept };
}

/**
 * A cube of NAXIS1 pixels x NAXIS2 spectra x NAXIS3 planes. Plane roles from
 * BANDIDn (first word: 'spectrum', 'sigma', ...); without them plane 1 is the
 * flux, plane 2 the uncertainty (its kind judged from the data of the first
 * row, as for 1-D images) and plane 3 a mask when it holds whole numbers >= 0.
 */
function cubeLayout(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[], hdu: FitsHdu, nRows: number, nPlanes: number): MultiObjectFile {
  const nPix = hdu.axes[0];
  const h = hdu.header;
  const where = { hdu: hdu.index, keyword: 'NAXIS3' };
  if (nPlanes > 16) throw new SpectrumReadError(file, `image of shape ${hdu.axes.join(' x ')}: ${nPlanes} planes per spectrum is not a flux/uncertainty/mask cube`, where);
  checkPixelCount(file, nPix, { hdu: hdu.index, keyword: 'NAXIS1' });
  checkRowCount(file, nRows, { hdu: hdu.index, keyword: 'NAXIS2' });
  const bandIds: (string | undefined)[] = [];
  for (let i = 1; i <= nPlanes; i++) bandIds.push(h.str(`BANDID${i}`));
  const described = bandIds.some((b) => b !== undefined);
  const roles: (Role | null)[] = described ? bandIds.map((b) => (b === undefined ? null : roleOf(b.split(/[\s,-]+/)[0] ?? ''))) : [];
  const fluxPlane = described ? Math.max(roles.indexOf('flux'), 0) : 0;
  const noisePlane = described ? roles.findIndex((r, i) => i !== fluxPlane && isUncertainty(r)) : nPlanes >= 2 ? 1 : -1;
  let maskPlane = described ? roles.indexOf('mask') : -1;
  const row = (plane: number, r: number) => imageRow(bytes, hdu, plane * nRows + r, file);
  let noiseKind: 'ivar' | 'variance' | 'error' = 'ivar';
  if (described && noisePlane >= 0) noiseKind = roles[noisePlane] as 'ivar' | 'variance' | 'error';
  else if (!described && noisePlane >= 0) noiseKind = guessNoiseKind(row(fluxPlane, 0), row(noisePlane, 0));
  if (!described && nPlanes >= 3) {
    let allMask = true;
    for (let r = 0; r < nRows && allMask; r++) allMask = isMaskLike(row(2, r));
    maskPlane = allMask ? 2 : -1;
  }
  const axis = spectralAxis(h, nPix, file, hdu.index) ?? (hdu.index > 0 ? spectralAxis(hdus[0].header, nPix, file, 0) : null);
  if (!axis) throw new SpectrumReadError(file, 'no wavelength axis for the spectra in the cube: no spectral WCS or COEFF0/COEFF1', { hdu: hdu.index, keyword: 'CTYPE1' });
  const facts = fibreTable(bytes, file, hdus, nRows, -1) ?? apertureIds(h, nRows);
  const meta = sharedMeta(hdu.index > 0 ? [h, hdus[0].header] : [h]);
  const kept = keepRows(nRows, facts, (r) => ({
    index: r + 1,
    read: (id) => {
      const flux = row(fluxPlane, r);
      const ivar = noisePlane >= 0 ? toInverseVariance(row(noisePlane, r), noiseKind) : null;
      const mask = maskPlane >= 0 ? toMask(row(maskPlane, r)) : undefined;
      return assembleRow(id, 'fits-image-rows', hdu.index, axis.wavelengthA, axis.air, flux, ivar, mask, meta, facts?.[r]);
    },
  }));
  return { kind: 'image-rows', hdu: hdu.index, rowCount: nRows, ...kept };
}

// ---- table rows ----

function tableLayout(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[]): MultiObjectFile | null {
  for (const hdu of hdus) {
    if (hdu.kind !== 'bintable' || hdu.axes[1] < 2) continue;
    const cols = columnsOrNull(hdu, file);
    if (!cols) continue;
    const num = cols.filter(isNumeric);
    const flux = num.find((c) => c.role === 'flux' && c.repeat > 1);
    if (!flux) continue;
    return rowsOfTable(bytes, file, hdus, hdu, cols, flux);
  }
  return null;
}

function rowsOfTable(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[], hdu: FitsHdu, cols: TableColumn[], flux: TableColumn): MultiObjectFile {
  const nRows = hdu.axes[1];
  const n = flux.repeat;
  const h = hdu.header;
  checkPixelCount(file, n, { hdu: hdu.index, keyword: `TFORM${flux.number}`, column: flux.name });
  checkRowCount(file, nRows, { hdu: hdu.index, keyword: 'NAXIS2' });
  const num = cols.filter(isNumeric);
  const wave = num.find((c) => isWaveRole(c.role) && c.repeat > 1);
  const noise = num.find((c) => isUncertainty(c.role) && c.repeat > 1);
  const mask = num.find((c) => c.role === 'mask' && c.repeat > 1) ?? (noise ? undefined : num.find((c) => c.role === 'bitmask' && c.repeat > 1));
  for (const c of [wave, noise, mask]) {
    if (c && c.repeat !== n) {
      throw new SpectrumReadError(file, `column '${c.name}' has ${c.repeat} values per row but '${flux.name}' has ${n}`, {
        hdu: hdu.index,
        keyword: `TFORM${c.number}`,
        column: c.name,
      });
    }
  }
  const headers = hdu.index > 0 ? [h, hdus[0].header] : [h];
  const airHeader = headerSaysAir(h) || (hdu.index > 0 && headerSaysAir(hdus[0].header));
  let shared: SharedAxis | null = null;
  if (!wave) {
    const axis = spectralAxis(h, n, file, hdu.index) ?? (hdu.index > 0 ? spectralAxis(hdus[0].header, n, file, 0) : null);
    if (!axis) {
      throw new SpectrumReadError(file, `no wavelength: the table has no wavelength array column and the header no spectral WCS or COEFF0/COEFF1 (columns: ${cols.map((c) => c.name).join(', ')})`, {
        hdu: hdu.index,
      });
    }
    shared = { wavelengthA: axis.wavelengthA, air: axis.air };
  }
  // Ids from the table's own scalar columns, else from a fibre table with as many rows.
  const facts = describesRows(cols) || scalarColumn(cols, RA_COLUMNS, true) ? rowFacts(bytes, hdu, cols) : fibreTable(bytes, file, hdus, nRows, hdu.index);
  const meta = sharedMeta(headers, flux.unit || undefined);
  const cell = (c: TableColumn, r: number): Float64Array => {
    const scaling = { scale: c.scale, zero: c.zero, ...(c.tnull !== undefined ? { blank: c.tnull } : {}) };
    return decodeValues(bytes, hdu.dataOffset + r * hdu.axes[0] + c.offset, n, NUMERIC_BITPIX[c.type], scaling);
  };
  const kept = keepRows(nRows, facts, (r) => ({
    index: r + 1,
    read: (id) => {
      let wl: Float64Array;
      let air: boolean;
      if (wave) {
        wl = cell(wave, r);
        columnWavelengthsToAngstrom(wl, wave, id, hdu.index);
        air = wave.role === 'wave-air' || airHeader;
      } else {
        wl = shared!.wavelengthA;
        air = shared!.air;
      }
      const ivar = noise ? toInverseVariance(cell(noise, r), noise.role as 'ivar' | 'variance' | 'error') : null;
      const m = mask ? toMask(cell(mask, r)) : undefined;
      return assembleRow(id, 'fits-table-rows', hdu.index, wl, air, cell(flux, r), ivar, m, meta, facts?.[r]);
    },
  }));
  return { kind: 'table-rows', hdu: hdu.index, rowCount: nRows, ...kept };
}

/**
 * The multi-object layout of a FITS file, or null when it holds one spectrum
 * (then the single-spectrum reader applies). Throws SpectrumReadError for a
 * multi-object file that cannot be read at all (no wavelength axis, columns of
 * different lengths, too many rows); problems of one row surface only when
 * that row is read.
 */
export function multiObjectLayout(bytes: Uint8Array, file: string, hdus: readonly FitsHdu[]): MultiObjectFile | null {
  return imageLayout(bytes, file, hdus) ?? tableLayout(bytes, file, hdus);
}
