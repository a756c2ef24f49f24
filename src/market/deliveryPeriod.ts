/** One delivery period of a market (docs/design.md section 2). */
export interface DeliveryPeriod {
  /** Start, ISO 8601 with the market zone's offset. */
  readonly start: string;
  /** End, ISO 8601 with the market zone's offset. */
  readonly end: string;
  /** Start as epoch milliseconds (for joins and sorting). */
  readonly startMs: number;
}
