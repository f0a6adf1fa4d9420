/**
 * Write the synthetic demo set to sample-spectra/ (run: npm run samples).
 * Everything is built in memory by buildSampleSet (src/core/sim/sampleSet.ts)
 * from a fixed seed, and the 64-fibre plate by buildSamplePlate
 * (src/core/sim/samplePlate.ts) with its truth table; this script only clears
 * the old files and writes the new ones. README.md in the folder is kept.
 */
import { mkdirSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildSampleSet, SAMPLE_SEED } from '../src/core/sim/sampleSet';
import { buildSamplePlate, plateTruthCsv, PLATE_TRUTH_NAME } from '../src/core/sim/samplePlate';

const outDir = join(dirname(fileURLToPath(import.meta.url)), '..', 'sample-spectra');
const seedArg = process.argv.find((a) => a.startsWith('--seed='));
const seed = seedArg ? Number(seedArg.slice('--seed='.length)) : SAMPLE_SEED;
if (!Number.isInteger(seed)) throw new Error(`bad --seed: ${seedArg}`);

mkdirSync(outDir, { recursive: true });
for (const entry of readdirSync(outDir)) {
  if (entry === 'README.md') continue;
  rmSync(join(outDir, entry), { recursive: true, force: true });
}

const { files, truth } = buildSampleSet(seed);
const plate = buildSamplePlate(seed);
files.push(plate.file, { name: PLATE_TRUTH_NAME, bytes: new TextEncoder().encode(plateTruthCsv(plate.truth)) });
let total = 0;
for (const f of files) {
  const path = join(outDir, ...f.name.split('/'));
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, f.bytes);
  total += statSync(path).size;
}
const spectra = truth.filter((t) => t.layout !== 'broken').length;
const plateSpectra = plate.truth.filter((t) => t.expect !== 'dropped').length;
console.log(`wrote ${files.length} files (${spectra} spectra, ${truth.length - spectra} broken, truth.csv; a plate of ${plateSpectra} spectra, ${PLATE_TRUTH_NAME}) to ${outDir}: ${(total / 1e6).toFixed(2)} MB, seed ${seed}`);
