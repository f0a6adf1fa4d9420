/** The published-template CSV layout (src/core/templates/published/README.md): '#' header lines, then wavelength_vacuum_angstrom,flux[,error]. */
export interface TemplateTable {
  name: string;
  wavelengthA: Float64Array;
  flux: Float64Array;
}

export function readTemplateCsv(text: string, name: string): TemplateTable {
  const wl: number[] = [];
  const fl: number[] = [];
  for (const line of text.split(/\r?\n/)) {
    if (line === '' || line.startsWith('#') || line.startsWith('wavelength')) continue;
    const [a, b] = line.split(',');
    const w = Number(a);
    const f = Number(b);
    if (!Number.isFinite(w) || !Number.isFinite(f)) throw new Error(`${name}: bad row "${line}"`);
    wl.push(w);
    fl.push(f);
  }
  if (wl.length < 2) throw new Error(`${name}: fewer than 2 rows`);
  return { name, wavelengthA: Float64Array.from(wl), flux: Float64Array.from(fl) };
}
