/** A point forecast of one delivery day on the slot grid. */
export interface PointForecast {
  /** The forecast per slot [currency/MWh], length S: the mean of the members. */
  readonly mean: Float64Array;
  /**
   * The forecasts averaged into `mean`, one per calibration window for the regression models (the
   * inputs of quantile regression averaging), or `[mean]` for a model without windows.
   */
  readonly members: readonly Float64Array[];
}

/** The element-wise mean of equally long vectors (at least one). */
export function averageMembers(members: readonly Float64Array[]): Float64Array {
  const first = members[0];
  if (first === undefined) throw new RangeError('averageMembers needs at least one member');
  const mean = new Float64Array(first.length);
  for (const m of members) for (let s = 0; s < mean.length; s++) mean[s] = (mean[s] as number) + (m[s] as number);
  for (let s = 0; s < mean.length; s++) mean[s] = (mean[s] as number) / members.length;
  return mean;
}
