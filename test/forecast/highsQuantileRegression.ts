import loadHighs from 'highs';

/**
 * The linear quantile regression of y on the rows of a design, solved as the linear program of
 * Koenker and Bassett (1978), min sum_i tau u_i + (1 - tau) v_i s.t. x_i b + u_i - v_i = y_i,
 * u, v >= 0, b free, by HiGHS (npm highs, a dev dependency): an outside reference for the project's
 * own simplex. Returns the coefficients and the optimal objective.
 */
export async function highsQuantileRegression(rows: readonly (readonly number[])[], y: readonly number[], tau: number): Promise<{ coefficients: number[]; objective: number }> {
  const highs = await loadHighs();
  const k = rows[0]?.length ?? 0;
  const objective = rows.map((_, i) => `${tau} u${i} + ${1 - tau} v${i}`).join(' + ');
  const constraints = rows.map((r, i) => ` r${i}: ${r.map((value, j) => `${value} b${j}`).join(' + ')} + u${i} - v${i} = ${y[i]}`).join('\n');
  const free = Array.from({ length: k }, (_, j) => ` b${j} free`).join('\n');
  const lp = `Minimize\n obj: ${objective}\nSubject To\n${constraints}\nBounds\n${free}\nEnd\n`;
  const result = highs.solve(lp, { output_flag: false, primal_feasibility_tolerance: 1e-10, dual_feasibility_tolerance: 1e-10 });
  if (result.Status !== 'Optimal') throw new Error(`HiGHS ended with ${result.Status}`);
  const coefficients = Array.from({ length: k }, (_, j) => (result.Columns[`b${j}`] as { Primal: number }).Primal);
  return { coefficients, objective: result.ObjectiveValue };
}
