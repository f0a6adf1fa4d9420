/** Public face of the spectrum simulator. */
export { createRng, mulberry32, mixSeed, type Rng } from './prng';
export { DEFAULT_GRID, makeGrid, type GridSpec } from './grid';
export { tauEff, forestTransmission, forestAmplitude } from './forest';
export { simulateSpectrum, FLUX_UNIT, type SimClass, type SimParams, type SimTruth, type Simulated } from './simulateSpectrum';
export { simulateBatch, simulateBatchItem, batchParams, type BatchOptions } from './simulateBatch';
export type { TruthLine } from './model';
export type { StarType } from './star';
export { buildSampleSet, truthCsv, parseTruthCsv, SAMPLE_SEED, type SampleSet, type SampleFile, type SampleTruthRow } from './sampleSet';
export { PLAN, FIELD_NAME, FIELD_CODE, type SampleLayout, type PlannedObject } from './samplePlan';
