/**
 * What the demo set (sample-spectra/) gives as rows: one per file, except the
 * plate, which gives one per kept fibre (truth-plate.csv: sky and unused
 * fibres dropped; the dead fibre a failed row of its own). For tests that
 * count rows in the browser or in exports.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { listDemoFiles } from '../../scripts/demoSetPlugin';
import { parsePlateTruthCsv, PLATE_NAME, PLATE_TRUTH_NAME } from '../../src/core/sim/samplePlate';

/** Row ids (the `file` column) as the app names them: `sample-spectra/<path>` and `sample-spectra/<plate>#n`. */
export function demoRowIds(demoDir: string): string[] {
  const plate = parsePlateTruthCsv(readFileSync(join(demoDir, PLATE_TRUTH_NAME), 'utf8')).filter((t) => t.expect !== 'dropped');
  return listDemoFiles(demoDir)
    .flatMap((rel) => (rel === PLATE_NAME ? plate.map((t) => t.id) : [rel]))
    .map((rel) => `sample-spectra/${rel}`);
}

/** Rows of the plate that must fail on their own (the dead fibre). */
export function demoPlateFailures(demoDir: string): number {
  return parsePlateTruthCsv(readFileSync(join(demoDir, PLATE_TRUTH_NAME), 'utf8')).filter((t) => t.expect === 'error').length;
}
