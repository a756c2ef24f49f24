import type { DeliveryPeriod, MarketSpec, Order } from '../types.js';
import { htmlPage, paragraph, type PageSection } from './htmlPage.js';
import { ordersBlocks } from './planReport.js';
import { factList, htmlTable } from './table.js';
import { numberText } from './tickLabel.js';

/** The parts of a curve or auto plan's summary (app/plan/scenarioPlanSummary.ts) the report draws. */
export interface ScenarioPlanReportSummary {
  readonly day: string;
  readonly policy: string;
  readonly currency: string;
  readonly submitted: string;
  readonly why: string;
  readonly criterion: { readonly riskWeight: number; readonly switchStandardErrors: number };
  readonly scenarios: { readonly planningPaths: number; readonly freshPaths: number; readonly curveSteps: number; readonly imbalance: string; readonly solver: string };
  readonly candidates: readonly {
    readonly name: string;
    readonly fresh: { readonly meanProfit: number; readonly sd: number; readonly cvar5: number; readonly lossProbability: number; readonly imbalanceMwh: number };
    readonly endShortfallMwh: number;
    readonly value: number;
    readonly advantageOverPriceTaking: number;
    readonly advantageStandardError: number;
    readonly planned: { readonly meanProfit: number } | null;
  }[];
  readonly inputs: Readonly<Record<string, string>>;
}

export interface ScenarioPlanReportInput {
  readonly summary: ScenarioPlanReportSummary;
  readonly orders: readonly Order[];
  readonly periods: readonly DeliveryPeriod[];
  readonly market: MarketSpec;
}

/**
 * The report of a curve or auto plan: what was submitted and why, the table of candidates scored on the
 * fresh paths (with the curve's figure on its planning paths beside it), and the orders. Same input,
 * same bytes.
 */
export function scenarioPlanReport(input: ScenarioPlanReportInput): string {
  const { summary, market } = input;
  const money = summary.currency;
  const sc = summary.scenarios;
  const facts: [string, string][] = [
    ['submitted', summary.submitted],
    ['why', summary.why],
    ['criterion', `mean profit + ${numberText(summary.criterion.riskWeight, 3)} x CVaR 5 %, on ${sc.freshPaths} fresh paths; price-taking is left only for an advantage above ${numberText(summary.criterion.switchStandardErrors, 2)} standard errors, seen on both halves of the fresh paths`],
    ['curves', `planned on ${sc.planningPaths} paths, at most ${sc.curveSteps} steps per period, solver ${sc.solver}`],
    ['imbalance prices', sc.imbalance],
  ];
  const rows = summary.candidates.map((c) => [
    c.name,
    c.fresh.meanProfit,
    c.fresh.sd,
    c.fresh.cvar5,
    c.fresh.lossProbability,
    c.fresh.imbalanceMwh,
    c.endShortfallMwh,
    c.advantageOverPriceTaking,
    c.advantageStandardError,
    c.planned === null ? null : c.planned.meanProfit,
  ]);
  const sections: PageSection[] = [
    { id: 'summary', heading: 'Summary', blocks: [factList(facts)] },
    {
      id: 'candidates',
      heading: 'Candidates on the fresh paths',
      blocks: [
        paragraph('Every candidate settled on the same fresh paths, which were not used to plan the curves. CVaR 5 % is the mean of the worst 5 % of paths; the advantage is the paired mean difference from price-taking with its standard error. The last column is the mean on the paths the curves were planned on: it flatters them.'),
        htmlTable({
          columns: [
            { header: 'candidate' },
            { header: 'mean profit', unit: money, decimals: 2 },
            { header: 'sd', unit: money, decimals: 2 },
            { header: 'CVaR 5 %', unit: money, decimals: 2 },
            { header: 'P(loss)', unit: '-', decimals: 3 },
            { header: 'imbalance', unit: 'MWh', decimals: 3 },
            { header: 'end shortfall', unit: 'MWh', decimals: 3 },
            { header: 'vs price-taking', unit: money, decimals: 2 },
            { header: 'standard error', unit: money, decimals: 2 },
            { header: 'planned mean', unit: money, decimals: 2 },
          ],
          rows,
        }),
      ],
    },
    { id: 'orders', heading: 'Orders', blocks: ordersBlocks(input.orders, market.periodMinutes / 60, `${money}/MWh`, 'No orders: the submitted candidate trades nothing this day.') },
    { id: 'inputs', heading: 'Inputs', blocks: [htmlTable({ columns: [{ header: 'input' }, { header: 'file' }], rows: Object.entries(summary.inputs).map(([k, v]) => [k, v]) })] },
  ];
  return htmlPage({
    title: `Plan for delivery day ${summary.day}`,
    subtitle: `${input.periods.length} delivery periods of ${market.periodMinutes} min, ${market.timeZone}; policy ${summary.policy}; prices in ${money}/MWh.`,
    sections,
    footer:
      'Written by quantbid. The orders are a market position, not a control signal: the battery\'s own management system, its limits and the market rules always take precedence (see SAFETY.md). This page is self-contained: it runs no scripts and loads nothing from the network.',
  });
}
