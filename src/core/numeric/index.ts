export { symmetricEigen, type SymmetricEigen } from './symmetricEigen';
export { choleskySolve, choleskySolveSubset, PIVOT_TOL } from './cholesky';
export { median, medianInPlace, nmad } from './median';
