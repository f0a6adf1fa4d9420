export { SPEED_OF_LIGHT_KMS, MPC_KM, GYR_S, hubbleTimeGyr, hubbleDistanceMpc } from './constants';
export { DEFAULT_COSMOLOGY, omegaLambda, checkCosmology, describeCosmology } from './params';
export { hubbleRatio } from './integrals';
export {
  comovingDistanceMpc,
  transverseComovingDistanceMpc,
  luminosityDistanceMpc,
  angularDiameterDistanceMpc,
  distanceModulusMag,
  kpcPerArcsec,
} from './distances';
export { lookbackTimeGyr, ageGyr } from './times';
export { flatMatterLambdaAgeGyr } from './closedForm';
export { derivedQuantities, type DerivedQuantities } from './derived';
