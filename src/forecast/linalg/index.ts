/** Linear algebra for the forecasting models: least squares, LASSO, exact quantile regression. */
export { choleskyLeastSquares } from './choleskyLeastSquares.js';
export { SolverError } from './errors.js';
export { LASSO_DEFAULTS, lassoAt, lassoBic } from './lasso.js';
export type { LassoFit, LassoOptions, LassoPathPoint } from './lasso.js';
export { independentColumns, leastSquaresQr, pivotedColumns } from './leastSquaresQr.js';
export type { LeastSquaresFit, LeastSquaresOptions } from './leastSquaresQr.js';
export { fromStandardised, predictLinear } from './linearModel.js';
export type { LinearModel } from './linearModel.js';
export { matrixFromRows, multiply } from './matrix.js';
export type { Matrix } from './matrix.js';
export { QuantileRegressionProblem, quantileRegression } from './quantileRegression.js';
export type { QuantileRegressionFit, QuantileRegressionOptions } from './quantileRegression.js';
export { nestedStandardisedGrams, standardiseCentredSums, standardisedGram } from './standardisedGram.js';
export type { StandardisedGram } from './standardisedGram.js';
