/** Every family from the published tables, by file name (without .csv); `exclude` holds names left out (held-out tests). */
import type { TemplateTable } from './readTemplateCsv';
import { buildGalaxyFamily, buildQsoFamily, buildStarFamily, type FamilyBasis } from './recipes';

export function buildAllFamilies(tables: TemplateTable[], exclude: ReadonlySet<string> = new Set()): FamilyBasis[] {
  const use = tables.filter((t) => !exclude.has(t.name));
  const maybe = (n: string) => use.find((x) => x.name === n) ?? null;
  const galaxy = buildGalaxyFamily(use.filter((t) => t.name.startsWith('kc96_') || t.name.startsWith('bc03_')));
  return [
    buildQsoFamily(maybe('vandenberk2001_sdss_median_composite'), maybe('selsing2016_xshooter_composite'), galaxy),
    galaxy,
    buildStarFamily(use.filter((t) => t.name.startsWith('pickles_'))),
  ];
}
