import type { BatteryModel, MarketSpec, QuantileDay } from '../../types.js';
import { dayBidOrders } from '../../backtest/dayBid.js';
import { planPolicyDay } from '../../backtest/planPolicyDay.js';
import { SCENARIO_DEFAULTS } from '../../backtest/scenarioPlanning.js';
import type { SparseLpSolver } from '../../curves/linearProgram.js';
import { gatherProblems, InputError, type InputProblem } from '../../errors/inputError.js';
import { jsonText, ordersCsv } from '../../io/planOutputs.js';
import { readPriceHistory } from '../../io/readPriceHistory.js';
import { readQuantileForecast, type QuantileForecastFile } from '../../io/readQuantileForecast.js';
import type { UnacceptedRule } from '../../settle/unacceptedRule.js';
import { writeOutputs } from '../../io/writeOutputs.js';
import type { OutputLock } from '../../io/outputLock.js';
import { scenarioPlanReport } from '../../report/scenarioPlanReport.js';
import type { Done } from '../commandResult.js';
import type { RunHooks } from '../runHooks.js';
import { imbalancePathSource } from '../scenarios/pathScenarios.js';
import { runScenarioPaths } from '../scenarios/quantilePaths.js';
import { requireCurvesOffered, scenarioPlanningOf } from '../scenarios/scenarioPlanningOf.js';
import type { ScenarioSettings } from '../scenarios/scenarioSettings.js';
import { orderLines } from './planSummary.js';
import { candidateTableText, scenarioPlanSummary, whyText } from './scenarioPlanSummary.js';

export interface ScenarioPlanRequest {
  readonly day: string;
  readonly policy: 'curve' | 'auto';
  readonly scenarios: ScenarioSettings;
  readonly market: MarketSpec;
  readonly battery: BatteryModel;
  readonly forecastFile: QuantileForecastFile;
  readonly forecast: QuantileDay;
  readonly socStartMwh: number;
  /** The rule for unaccepted orders the candidates are scored under (a curve moves with what clears). */
  readonly unaccepted: UnacceptedRule;
  /** Input files by role as the user named them; `history` when given. */
  readonly inputs: Readonly<Record<string, string>>;
  readonly out: string | undefined;
  readonly force: boolean;
  readonly report: boolean;
  /** List every submitted order in the printed summary (the demo does). */
  readonly listOrders: boolean;
  readonly solver: SparseLpSolver;
  /** The output folder's lock, held for the whole run (io/outputLock.ts). */
  readonly lock: OutputLock | undefined;
}

export type ScenarioPlanSummary = ReturnType<typeof scenarioPlanSummary>;

/** The outputs of a curve or auto plan: no schedule.csv, since a curve's flows depend on the prices. */
export const SCENARIO_PLAN_OUTPUTS = ['orders.csv', 'plan.json'] as const;

/**
 * `quantbid plan --policy curve|auto`: the day's paths (runScenarioPaths: the --paths file, or made from the quantile file and the history) split into planning and fresh
 * paths with their imbalance prices (pathScenarioSource), the candidates planned and scored
 * (backtest/planPolicyDay.ts), the submitted bids written as orders.csv (a curve as one row per step),
 * plan.json with the table of candidates, and report.html when asked.
 */
export function scenarioPlan(request: ScenarioPlanRequest, hooks: RunHooks): Done<ScenarioPlanSummary> {
  const { day, policy, market, battery, forecast, socStartMwh, scenarios } = request;
  requireCurvesOffered([policy], market, request.inputs['market'] ?? 'market');
  const problems: InputProblem[] = [];
  const historyPath = request.inputs['history'];
  const history = historyPath === undefined ? null : (gatherProblems(problems, () => readPriceHistory(historyPath, market, (text) => hooks.note(text))) ?? null);
  // Paths made from the quantile file, and the imbalance spread on the surprise (fitted on the history's
  // days that have a forecast), need the file's past days: the whole file is read only then.
  const forecastPath = request.inputs['forecast'];
  const needsPast = forecastPath !== undefined && (scenarios.paths === undefined || history !== null);
  const pastForecast = needsPast ? gatherProblems(problems, () => readQuantileForecast(forecastPath, market)) : request.forecastFile;
  if ((historyPath !== undefined && history === null) || pastForecast === undefined) throw new InputError(problems);
  const runPaths = runScenarioPaths(scenarios, { market, history, forecastDays: pastForecast.days, days: [day], policies: [policy] });
  const imbalance = imbalancePathSource(day, { market, history, forecastDays: pastForecast.days });
  const planning = scenarioPlanningOf(scenarios, { market, history, forecast: pastForecast, tools: { lpSolver: request.solver }, paths: runPaths.paths });
  const made = planning.scenarios(forecast);
  const socEndMinMwh = battery.socFinalMinMwh ?? socStartMwh;
  const plan = planPolicyDay({
    policy, forecast, realised: null, market, battery, alpha: SCENARIO_DEFAULTS.alphas[1] as number, socStartMwh, solveOptions: {},
    unaccepted: request.unaccepted, scenarioPlanning: planning, scenarios: () => made,
  });
  if (plan.status !== 'optimal' || plan.scenarioReport === null) {
    throw new InputError([{ file: request.inputs['battery'] ?? 'battery', message: `no feasible plan for ${day}: ${plan.status === 'optimal' ? 'no scenario report' : plan.reason}`, fix: 'check the battery spec and --soc-start' }]);
  }
  const { choice } = plan.scenarioReport;
  const orders = dayBidOrders(forecast.periods, plan.orders);
  const context = {
    day, policy, market, inputs: { ...request.inputs, ...(scenarios.paths === undefined ? {} : { paths: scenarios.paths }) }, scenarioPaths: runPaths.source, periods: forecast.periods, socStartMwh, socEndMinMwh, unaccepted: request.unaccepted,
    riskWeight: scenarios.riskWeight, switchStandardErrors: planning.switchStandardErrors,
    planningPaths: made.planning.pathCount, validationPaths: made.validation.pathCount, freshPaths: made.fresh.pathCount, curveSteps: planning.curveSteps,
    imbalance: imbalance.description, solver: request.solver.name,
  };
  const summary = scenarioPlanSummary(choice, orders, context);
  const outputs = request.report ? [...SCENARIO_PLAN_OUTPUTS, 'report.html'] : [...SCENARIO_PLAN_OUTPUTS];
  if (request.out !== undefined) {
    writeOutputs(
      request.out,
      [
        { name: 'orders.csv', text: ordersCsv(orders) },
        { name: 'plan.json', text: jsonText(summary) },
        ...(request.report ? [{ name: 'report.html', text: scenarioPlanReport({ summary, orders, periods: forecast.periods, market }) }] : []),
      ],
      request.force,
      ['report.html', 'schedule.csv'],
      request.lock,
    );
  }
  const lines = [
    `plan for ${day} (${forecast.periods.length} periods of ${market.periodMinutes} min), policy ${policy}, risk weight ${scenarios.riskWeight}, unaccepted orders ${request.unaccepted}`,
    `  scenarios: ${made.planning.pathCount} planning and ${made.fresh.pathCount} fresh paths; imbalance: ${imbalance.description}`,
    `  paths: ${runPaths.source}`,
    ...candidateTableText(choice, market.currency),
    `  submitted: ${summary.submitted} (${whyText(choice, planning.switchStandardErrors)})`,
    `  orders: ${summary.orders.rows} rows, ${summary.orders.buys} buys, ${summary.orders.sells} sells; a proposal for the exchange, not a control signal`,
    ...(request.listOrders ? orderLines(orders, undefined, market) : []),
  ];
  if (request.out !== undefined) lines.push(`  wrote ${outputs.map((name, i) => (i === 0 ? `${request.out}/${name}` : name)).join(', ')}`);
  return { status: 'done', summary, text: `${lines.join('\n')}\n` };
}
