import { OKABE_ITO } from './palette.js';

/** How a policy is drawn on every page: one colour per policy, the upper bound dashed (a cue besides colour). */
export interface PolicyStyle {
  readonly colour: string;
  readonly dash: boolean;
  /** Name in legends, e.g. `perfect foresight (ceiling)`. */
  readonly label: string;
}

/**
 * Colours of the backtest policies, from the Okabe-Ito set (palette.ts). Bluish green and vermillion
 * are left out: they mean buying and selling (ROLE_COLOURS) wherever sides are drawn.
 */
export const POLICY_STYLES: Readonly<Record<string, PolicyStyle>> = Object.freeze({
  quantile: { colour: OKABE_ITO.blue, dash: false, label: 'quantile' },
  median: { colour: OKABE_ITO.orange, dash: false, label: 'median' },
  point: { colour: OKABE_ITO.reddishPurple, dash: false, label: 'point' },
  'price-taking': { colour: OKABE_ITO.skyBlue, dash: false, label: 'price-taking' },
  'perfect-foresight': { colour: OKABE_ITO.black, dash: true, label: 'perfect foresight (ceiling)' },
});

/** The style of a policy; an unknown name (a policy added later) gets black, solid, its own name. */
export function policyStyle(policy: string): PolicyStyle {
  return POLICY_STYLES[policy] ?? { colour: OKABE_ITO.black, dash: false, label: policy };
}
