export { symmetricEigen, type SymmetricEigen } from './symmetricEigen';
export { choleskySolve, choleskySolveSubset, choleskyFactor, choleskyFactorSolve, inverseSpd, inverseSpdInto, PIVOT_TOL } from './cholesky';
export { median, medianInPlace, nmad } from './median';
export { segmentIndex, interpLinear } from './interpolate';
