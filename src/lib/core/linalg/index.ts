/** Dense Float64Array linear algebra for the hot paths (row-major layout throughout). */
export { matMul, matMulT, matTMul, transpose, gramRows, gramCols, identity } from './matMul';
export { symEigen, type SymEigen } from './symEigen';
export { svd, type Svd } from './svd';
export { randomOrthogonal, symmetricDecorrelate } from './orthogonal';
export { cholesky, choleskySolve, type Cholesky } from './cholesky';
