/**
 * Pinball (quantile, check) loss of a quantile forecast q at level tau for the realised value y:
 *   rho_tau(y - q) = (y - q)(tau - 1{y < q}),
 * i.e. tau (y - q) when y >= q and (1 - tau)(q - y) when y < q. Its expectation is minimised by the
 * true tau-quantile (Koenker and Bassett 1978; a strictly consistent scoring function, Gneiting and
 * Raftery 2007, section 6). Lower is better; the unit is that of y [currency/MWh].
 *
 * @example
 * pinballLoss(10, 8, 0.9); // 1.8  (0.9 * 2)
 * pinballLoss(10, 12, 0.9); // 0.2 (0.1 * 2)
 *
 * References: R. Koenker and G. Bassett (1978), Regression quantiles, Econometrica 46(1), 33-50;
 * T. Gneiting and A. E. Raftery (2007), Strictly proper scoring rules, prediction, and estimation,
 * JASA 102(477), 359-378, doi:10.1198/016214506000001437.
 */
export function pinballLoss(y: number, q: number, tau: number): number {
  return (y - q) * (tau - (y < q ? 1 : 0));
}
