import type { Order } from '../types.js';
import type { PeriodOrder } from '../settle/periodBid.js';

/**
 * A period's bid in a backtest: a schedule's order (with its period and quantile level, for the
 * ledger), a curve (a stack of limit orders, settle/periodBid.ts), or none.
 */
export type DayBid = Order | readonly PeriodOrder[] | null;
