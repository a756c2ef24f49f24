/**
 * Project economics for sizing a battery: present values, rates of return, payback and the yearly
 * cash flows of a project. End-of-year cash flows, year 0 = the investment. Pure, synchronous
 * functions; invalid arguments throw ArgumentError (from src/stats).
 */
export { npv } from './npv.js';
export { irr, DEFAULT_IRR_OPTIONS, type IrrOptions, type IrrResult } from './irr.js';
export { bisectRoot } from './bisectRoot.js';
export { annuityFactor } from './annuityFactor.js';
export { capitalRecoveryFactor } from './capitalRecoveryFactor.js';
export { simplePayback, discountedPayback, type PaybackResult } from './payback.js';
export { annualiseProfit, DAYS_PER_YEAR } from './annualiseProfit.js';
export {
  projectCashFlows,
  DEFAULT_PROJECT_OPTIONS,
  type ProjectInput,
  type ProjectCashFlows,
} from './projectCashFlows.js';
export { requireDiscountRate } from './discountRate.js';
export { yearCoverage, extrapolationWarning, MONTH_NAMES, DAYS_IN_A_YEAR, type YearCoverage } from './yearCoverage.js';
