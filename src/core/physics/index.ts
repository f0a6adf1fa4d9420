/** Quasar physics: continuum luminosities, broad-line widths, single-epoch masses, broad absorption. */
export { measureQuasar, type MeasureOptions } from './measure';
export { quasarQuantities, MPC_CM, type QuasarQuantities, type MassEstimate, type Valued } from './quantities';
export { fluxScaleOf, type FluxScale } from './fluxUnits';
export { MASS_CALIBRATIONS, MASS_SYSTEMATIC_DEX, BOLOMETRIC_CORRECTION, EDDINGTON_ERG_S_PER_MSUN, logVirialMass, preferredOrder } from './calibrations';
export { balIndices, measureBal, outflowKms, restOfOutflow, type Trough } from './bal';
export { REGIONS, type BroadLineId, type ContinuumRefA } from './regions';
export { physicsModelAt, troughMaskRangesA } from './draw';
export type { QuasarMeasurement, BroadLineResult, AbsorptionResult, ContinuumPoint, ContinuumShape } from './types';
