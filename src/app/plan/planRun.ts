import type { BatteryModel, BatterySpec, MarketSpec, QuantileDay } from '../../types.js';
import { batteryModel } from '../../battery/batteryModel.js';
import { gatherProblems, InputError, throwIfProblems, type InputProblem } from '../../errors/inputError.js';
import { jsonText, ordersCsv, scheduleCsv } from '../../io/planOutputs.js';
import { readQuantileForecastDay, type QuantileForecastForDay } from '../../io/readQuantileForecastDay.js';
import type { readPriceHistory } from '../../io/readPriceHistory.js';
import type { OutputLock } from '../../io/outputLock.js';
import type { ReadAhead } from '../../io/readAhead.js';
import type { Scenario } from '../../io/scenarioOf.js';
import { checkOutputFolder, writeOutputs } from '../../io/writeOutputs.js';
import { imbalanceExpectation } from '../../plan/imbalanceExpectation.js';
import { isSkippedDay } from '../../market/calendar.js';
import { planDay, type PlanResult } from '../../plan/planDay.js';
import type { planReport } from '../../report/planReport.js';
import type { Done } from '../commandResult.js';
import { forecastLevelProblems } from '../forecastLevels.js';
import { inputPathsOf, runInputFiles } from '../inputPaths.js';
import { lockedRun } from '../lockedRun.js';
import type { RunHooks } from '../runHooks.js';
import type { noPathsProblem } from '../scenarios/quantilePaths.js';
import type { PlanSettingsSchema, PlanTools } from './planUseCase.js';
import type { scenarioPlan, ScenarioPlanSummary } from './scenarioPlan.js';
import { planSummary, planSummaryText, planWarnings, planWorth, type PlanWorth } from './planSummary.js';
import type { z } from 'zod';
import { PLAN_DEFAULTS, planPolicy, type PlanCommandPolicy } from '../commandDefaults.js';

/** The plan's settings as planSettingsSchema returns them (defaults filled in, the policy when given). */
export type CheckedPlanSettings = z.output<PlanSettingsSchema>;

/** The settings with the policy settled: the one given, else the default or its fallback (planPolicy). */
type PlanRunSettings = CheckedPlanSettings & { readonly policy: PlanCommandPolicy };

export type PlanSummary = ReturnType<typeof planSummary> | ScenarioPlanSummary;

/**
 * What a plan reads and runs besides the planning itself, handed in so that this module loads none of
 * it: the readers of the scenario and spec files (with their schemas, or checked by hand and read
 * before), and the parts only some plans need (scenario planning for curve and auto, the report, the
 * history reader). planUseCase hands in all of them; the CLI's fast path (planFastPath.ts) only what
 * the plan at hand needs.
 */
export interface PlanParts {
  readonly readScenario: (file: string) => Scenario;
  /** market.json; `note` hears of an old field name read under its new one. */
  readonly readMarketSpec: (path: string, note: (text: string) => void) => MarketSpec;
  readonly readBatterySpec: (path: string) => BatterySpec;
  readonly scenarioPlanning?: {
    /** The files a scenario plan writes. */
    readonly outputs: readonly string[];
    readonly noPathsProblem: typeof noPathsProblem;
    /** scenarioPlan with the scenario settings' defaults filled in. */
    readonly plan: (request: Omit<Parameters<typeof scenarioPlan>[0], 'scenarios'> & { readonly scenarios: CheckedPlanSettings['scenarios'] }, hooks: RunHooks) => Done<ScenarioPlanSummary>;
  };
  readonly planReport?: typeof planReport;
  readonly readPriceHistory?: typeof readPriceHistory;
  /** The forecast file read ahead (readAhead.ts), taken when it is still the file's content. */
  readonly forecastReadAhead?: ReadAhead;
}

export const PLAN_OUTPUTS = ['orders.csv', 'schedule.csv', 'plan.json'] as const;

/** A part `parts` must hold for this plan: its absence is a fault of the caller. */
function needed<T>(part: T | undefined, what: string): T {
  if (part === undefined) throw new Error(`planRun: this plan needs ${what}, which the caller did not hand in`);
  return part;
}

/**
 * `quantbid plan` from its checked settings: one delivery day's orders and schedule from the quantile
 * forecast (planDay), written as orders.csv, schedule.csv, plan.json and, when asked, report.html into
 * `out` as one output set.
 */
export function planRun(checked: CheckedPlanSettings, parts: PlanParts, hooks: RunHooks, tools: PlanTools): Done<PlanSummary> {
  const { paths, demoDay } = inputPathsOf(checked.inputs.scenario === undefined ? undefined : parts.readScenario(checked.inputs.scenario), checked.inputs, ['market', 'battery', 'forecast'], ['history']);
  const s: PlanRunSettings = { ...checked, policy: planPolicy(checked.policy, checked.scenarios?.paths !== undefined, paths.history !== undefined) };
  const onScenarios = s.policy === 'curve' || s.policy === 'auto';
  // Without --paths the paths are made from the quantile file and the history: one of the two is needed.
  if (onScenarios && s.scenarios?.paths === undefined && paths.history === undefined) throw needed(parts.scenarioPlanning, 'scenario planning').noPathsProblem([s.policy]);
  const day = s.day ?? demoDay;
  if (day === undefined) {
    throw new InputError([{ file: 'command line', field: '--day', message: 'no delivery day given', fix: 'give --day YYYY-MM-DD' }]);
  }
  if (s.report && s.out === undefined) {
    throw new InputError([{ file: 'command line', field: '--report', message: 'report.html needs a folder to go to', fix: 'add --out DIR' }]);
  }
  const outputs = onScenarios ? [...needed(parts.scenarioPlanning, 'scenario planning').outputs, ...(s.report ? ['report.html'] : [])] : s.report ? [...PLAN_OUTPUTS, 'report.html'] : PLAN_OUTPUTS;
  if (s.out !== undefined) checkOutputFolder(s.out, outputs, s.force, runInputFiles(s.inputs, paths));
  const done = lockedRun(s.out, 'plan', (lock) => planDayRun(s, { paths, day, outputs, lock }, parts, hooks, tools));
  // Said once the plan is made (a plan refused for its inputs needs no word on the policy).
  if (checked.policy === undefined && s.policy !== PLAN_DEFAULTS.policy) {
    hooks.note(`note: the default policy, ${PLAN_DEFAULTS.policy}, scores its candidates on whole-day paths made from the forecast and a history; with no --history and no --paths this plan is ${s.policy}'s, its fallback\n`);
  }
  return done;
}

/** The plan of `day` from the checked settings, written under the output folder's lock (when there is a folder). */
function planDayRun(
  s: PlanRunSettings,
  run: { readonly paths: Record<'market' | 'battery' | 'forecast', string> & { readonly history?: string }; readonly day: string; readonly outputs: readonly string[]; readonly lock: OutputLock | undefined },
  parts: PlanParts,
  hooks: RunHooks,
  tools: PlanTools,
): Done<PlanSummary> {
  const { paths, day, outputs } = run;
  const { market, battery, forecastFile } = readPlanInputs(paths, day, parts, (text) => hooks.note(text));
  const forecast = forecastDay(forecastFile, day, market.timeZone);
  const socStartMwh = s.socStartMwh ?? battery.socInitialMwh;
  if (socStartMwh > battery.energyMwh) {
    throw new InputError([{ file: 'command line', field: '--soc-start', message: `${socStartMwh} MWh is more than the battery's energy ${battery.energyMwh} MWh`, fix: 'give the energy in store now, at most energyMwh' }]);
  }
  throwIfProblems(forecastLevelProblems(forecastFile.levels, forecastFile.file, { policies: [s.policy], alphas: [s.alpha], alphaOption: '--alpha', policyOption: '--policy' }));
  if (s.policy === 'curve' || s.policy === 'auto') {
    if (socStartMwh < battery.socMinMwh || socStartMwh > battery.socMaxMwh) {
      throw new InputError([{ file: 'command line', field: '--soc-start', message: `${socStartMwh} MWh is outside the battery's window [${battery.socMinMwh}, ${battery.socMaxMwh}] MWh, where ${s.policy} plans`, fix: 'give a start inside the window, or plan the way back with another policy first' }]);
    }
    if (tools.lpSolver === undefined) throw new Error(`planUseCase: the ${s.policy} policy needs tools.lpSolver (loadHighsSolver)`);
    const inputs: Record<string, string> = { ...paths };
    return needed(parts.scenarioPlanning, 'scenario planning').plan(
      { day, policy: s.policy, scenarios: s.scenarios, market, battery, forecastFile, forecast, socStartMwh, unaccepted: s.unaccepted, inputs, out: s.out, force: s.force, report: s.report, listOrders: s.listOrders, solver: tools.lpSolver, lock: run.lock },
      hooks,
    );
  }
  const result = planDay({ forecast, market, battery, policy: s.policy, alpha: s.alpha, socStartMwh });
  if (result.status !== 'optimal') {
    throw new InputError([{ file: paths.battery, message: `no feasible plan for ${day}: ${result.reason}`, fix: 'check the battery spec and --soc-start' }]);
  }
  // The imbalance price the orders expect: the market's rule, else the history's (read only then).
  const history = market.imbalance === undefined && paths.history !== undefined ? needed(parts.readPriceHistory, 'the history reader')(paths.history, market, (text) => hooks.note(text)) : undefined;
  const imbalance = imbalanceExpectation(market, history, day);
  const worth = planWorth(result, forecast, market, battery, imbalance);
  const baseline = s.policy === 'price-taking' ? null : baselineWorth({ forecast, market, battery, alpha: s.alpha, socStartMwh }, imbalance);
  const warnings = planWarnings(result, battery, market.currency, worth.losingPairs);
  const summary = planSummary(result, { day, policy: s.policy, alpha: s.alpha, paths, market, forecastFile, worth, baseline, warnings });
  if (s.out !== undefined) {
    writeOutputs(
      s.out,
      [
        { name: 'orders.csv', text: ordersCsv(result.orders) },
        { name: 'schedule.csv', text: scheduleCsv(forecast.periods, result.outcome.schedule) },
        { name: 'plan.json', text: jsonText(summary) },
        ...(s.report
          ? [{ name: 'report.html', text: needed(parts.planReport, 'the report')({ day, policy: s.policy, alpha: s.alpha, market, forecast, plan: result, inputs: paths, worth: { ifFilledAtLimits: worth.ifFilledAtLimits, expected: worth.expected?.value ?? null, baselineExpected: baseline?.expected?.value ?? null } }) }]
          : []),
      ],
      s.force,
      ['report.html'],
      run.lock,
    );
  }
  // Repaired, not refused (docs/design.md section 6); a note, so that --json output stays clean.
  const repaired = forecastFile.repairedByDay.get(day);
  if (repaired !== undefined) {
    hooks.note(`note: ${paths.forecast}: ${repaired.periods} of the ${forecast.periods.length} periods of ${day} had crossing quantiles, sorted into order (monotone rearrangement), e.g. ${repaired.example}\n`);
  }
  for (const warning of warnings) hooks.warn(`warning: ${warning.message}\n`);
  return { status: 'done', summary, text: planSummaryText(result, forecast, market, day, s, s.out, outputs, { worth, baseline, warnings, listOrders: s.listOrders }) };
}

/** The price-taking plan of the same day valued like the plan: the simplest baseline a plan is compared with. */
function baselineWorth(request: Omit<Parameters<typeof planDay>[0], 'policy'>, imbalance: ReturnType<typeof imbalanceExpectation>): PlanWorth | null {
  const plan: PlanResult = planDay({ ...request, policy: 'price-taking' });
  return plan.status === 'optimal' ? planWorth(plan, request.forecast, request.market, request.battery, imbalance) : null;
}

/**
 * The market spec, the battery and the forecast of `day` (which needs the market; only the day's rows
 * are parsed when they are sound). Every file is read even when one before it has problems, and all
 * problems are thrown together. `note` hears of an old field name read under its new one.
 */
function readPlanInputs(paths: Record<'market' | 'battery' | 'forecast', string>, day: string, parts: PlanParts, note: (text: string) => void): { market: MarketSpec; battery: BatteryModel; forecastFile: QuantileForecastForDay } {
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => parts.readMarketSpec(paths.market, note));
  const spec = gatherProblems(problems, () => parts.readBatterySpec(paths.battery));
  const forecastFile = market === undefined ? undefined : gatherProblems(problems, () => readQuantileForecastDay(paths.forecast, market, day, parts.forecastReadAhead));
  if (market === undefined || spec === undefined || forecastFile === undefined) throw new InputError(problems);
  return { market, battery: batteryModel(spec), forecastFile };
}

function forecastDay(file: QuantileForecastForDay, day: string, timeZone: string): QuantileDay {
  const found = file.days.get(day);
  if (found !== undefined) return found;
  if (isSkippedDay(day, timeZone)) {
    throw new InputError([{ file: 'command line', field: '--day', message: `${day} does not exist in ${timeZone}: the zone's clocks skipped the whole date`, fix: 'choose a delivery day the zone has, e.g. the day before or after' }]);
  }
  const incomplete = file.incompleteDays.find((d) => d.day === day);
  const covered = [...file.days.keys()];
  throw new InputError([
    incomplete
      ? { file: file.file, field: 'period_start', message: `the forecast for ${day} is incomplete: ${incomplete.reason}`, fix: 'give a forecast for every delivery period of the day' }
      : { file: file.file, field: 'period_start', message: `no forecast for ${day}${covered.length > 0 ? ` (the file covers ${covered[0]} to ${covered[covered.length - 1]})` : ''}`, fix: 'choose a day the forecast covers, or give the forecast for that day' },
  ]);
}
