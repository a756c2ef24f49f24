import { Command } from 'commander';
import type { BatteryModel, MarketSpec, PlanPolicy, QuantileDay } from '../types.js';
import { batteryModel } from '../battery/batterySpec.js';
import { LevelOutOfRangeError } from '../forecast/quantileSet.js';
import { gatherProblems, InputError, type InputProblem } from '../errors/inputError.js';
import { jsonText, ordersCsv, scheduleCsv } from '../io/planOutputs.js';
import { readQuantileForecast, type QuantileForecastFile } from '../io/readQuantileForecast.js';
import { readBatterySpec, readMarketSpec } from '../io/readSpecs.js';
import { checkOutputFolder, writeOutputs } from '../io/writeOutputs.js';
import { planDay, type PlanResult } from '../plan/planDay.js';
import { planReport } from '../report/planReport.js';
import { oneOf, parseAlphaArg, parseDayArg, parseNonNegativeArg, parsePathArg } from './argParsers.js';
import { addInputOptions, resolveInputs, type InputFlags } from './inputOptions.js';
import { planSummaryText } from './planSummary.js';
import type { CliIo } from './cliIo.js';

export interface PlanFlags extends InputFlags {
  readonly day?: string;
  readonly alpha: number;
  readonly policy: PlanPolicy;
  readonly socStart?: number;
  readonly out?: string;
  readonly force?: boolean;
  readonly json?: boolean;
  readonly report?: boolean;
}

export const PLAN_DEFAULTS = Object.freeze({ alpha: 0.1, policy: 'quantile' as PlanPolicy });
const PLAN_OUTPUTS = ['orders.csv', 'schedule.csv', 'plan.json'] as const;

export function planCommand(io: CliIo): Command {
  const command = new Command('plan')
    .description('plan one delivery day: orders (buy/sell, quantity, limit price) and a schedule from a quantile forecast')
    .option('--day <YYYY-MM-DD>', 'delivery day to plan (default: the scenario\'s demoDay)', parseDayArg)
    .option('--alpha <a>', 'central interval [q(alpha), q(1-alpha)]: buys limited at q(1-alpha), sells at q(alpha)', parseAlphaArg, PLAN_DEFAULTS.alpha)
    .option('--policy <name>', 'quantile | median | point', oneOf<PlanPolicy>(['quantile', 'median', 'point']), PLAN_DEFAULTS.policy)
    .option('--soc-start <MWh>', 'state of charge at the start of the day [MWh] (default: socInitialFraction x energyMwh)', parseNonNegativeArg)
    .option('--out <dir>', 'folder for orders.csv, schedule.csv and plan.json', parsePathArg)
    .option('--report', 'also write report.html into --out: forecast fan with the limit prices, schedule charts, orders table')
    .option('--force', 'overwrite existing outputs')
    .option('--json', 'print the summary as JSON on stdout');
  addInputOptions(command, ['market', 'battery', 'forecast']);
  command.addHelpText(
    'after',
    `
Examples:
  quantbid plan --scenario scenarios/halvorn/scenario.json --day 2027-01-01 --out plans/2027-01-01
  quantbid plan --market market.json --battery battery.json --forecast quantiles.csv \\
                --day 2027-03-28 --alpha 0.1 --out plans/2027-03-28
  quantbid plan --scenario scenarios/halvorn/scenario.json --policy median --alpha 0.2 --json`,
  );
  command.action((flags: PlanFlags) => runPlan(flags, io));
  return command;
}

export function runPlan(flags: PlanFlags, io: CliIo): void {
  const { paths, demoDay } = resolveInputs(flags, ['market', 'battery', 'forecast']);
  const day = flags.day ?? demoDay;
  if (day === undefined) {
    throw new InputError([{ file: 'command line', field: '--day', message: 'no delivery day given', fix: 'give --day YYYY-MM-DD' }]);
  }
  if (flags.report === true && flags.out === undefined) {
    throw new InputError([{ file: 'command line', field: '--report', message: 'report.html needs a folder to go to', fix: 'add --out DIR' }]);
  }
  if (flags.out !== undefined) checkOutputFolder(flags.out, flags.report === true ? [...PLAN_OUTPUTS, 'report.html'] : PLAN_OUTPUTS, flags.force === true);
  const { market, battery, forecastFile } = readPlanInputs(paths);
  const forecast = forecastDay(forecastFile, day);
  const socStartMwh = flags.socStart ?? battery.socInitialMwh;
  if (flags.socStart !== undefined && (socStartMwh < battery.socMinMwh || socStartMwh > battery.socMaxMwh)) {
    throw new InputError([{ file: 'command line', field: '--soc-start', message: `${socStartMwh} MWh is outside the battery's window [${battery.socMinMwh}, ${battery.socMaxMwh}] MWh`, fix: 'give a state of charge inside the window' }]);
  }
  const result = planWithLevelCheck(() => planDay({ forecast, market, battery, policy: flags.policy, alpha: flags.alpha, socStartMwh }), forecastFile, flags.alpha);
  if (result.status !== 'optimal') {
    throw new InputError([{ file: paths.battery, message: `no feasible plan for ${day}: ${result.reason}`, fix: 'check the battery spec and --soc-start' }]);
  }
  const summary = planSummary(result, { day, flags, paths, market, forecastFile });
  if (flags.out !== undefined) {
    writeOutputs(
      flags.out,
      [
        { name: 'orders.csv', text: ordersCsv(result.orders) },
        { name: 'schedule.csv', text: scheduleCsv(forecast.periods, result.outcome.schedule) },
        { name: 'plan.json', text: jsonText(summary) },
        ...(flags.report === true ? [{ name: 'report.html', text: planReport({ day, policy: flags.policy, alpha: flags.alpha, market, forecast, plan: result, inputs: paths }) }] : []),
      ],
      flags.force === true,
      ['report.html'],
    );
  }
  // Repaired, not refused (docs/design.md section 6); said on stderr so that --json output stays clean.
  if (forecastFile.repairedPeriods > 0) {
    io.stderr(`note: ${paths.forecast}: ${forecastFile.repairedPeriods} periods had crossing quantiles, sorted into order (monotone rearrangement), e.g. ${forecastFile.repairedExamples[0] ?? ''}\n`);
  }
  if (flags.json === true) io.stdout(jsonText(summary));
  else io.stdout(planSummaryText(result, forecast, market, day, flags, flags.out, flags.report === true ? [...PLAN_OUTPUTS, 'report.html'] : PLAN_OUTPUTS));
}

/**
 * The market spec, the battery and the forecast (which needs the market). Every file is read even when
 * one before it has problems, and all problems are thrown together.
 */
function readPlanInputs(paths: Record<'market' | 'battery' | 'forecast', string>): { market: MarketSpec; battery: BatteryModel; forecastFile: QuantileForecastFile } {
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => readMarketSpec(paths.market));
  const spec = gatherProblems(problems, () => readBatterySpec(paths.battery));
  const forecastFile = market === undefined ? undefined : gatherProblems(problems, () => readQuantileForecast(paths.forecast, market));
  if (market === undefined || spec === undefined || forecastFile === undefined) throw new InputError(problems);
  return { market, battery: batteryModel(spec), forecastFile };
}

function forecastDay(file: QuantileForecastFile, day: string): QuantileDay {
  const found = file.days.get(day);
  if (found !== undefined) return found;
  const incomplete = file.incompleteDays.find((d) => d.day === day);
  const covered = [...file.days.keys()];
  throw new InputError([
    incomplete
      ? { file: file.file, field: 'period_start', message: `the forecast for ${day} is incomplete: ${incomplete.reason}`, fix: 'give a forecast for every delivery period of the day' }
      : { file: file.file, field: 'period_start', message: `no forecast for ${day}${covered.length > 0 ? ` (the file covers ${covered[0]} to ${covered[covered.length - 1]})` : ''}`, fix: 'choose a day the forecast covers, or give the forecast for that day' },
  ]);
}

function planWithLevelCheck(run: () => PlanResult, file: QuantileForecastFile, alpha: number): PlanResult {
  try {
    return run();
  } catch (err) {
    if (err instanceof LevelOutOfRangeError) {
      throw new InputError([{ file: file.file, field: '--alpha', message: `alpha ${alpha} needs the levels ${alpha} and ${Number((1 - alpha).toFixed(9))}, outside the forecast's levels [${err.lowest}, ${err.highest}]`, fix: `choose --alpha so that alpha and 1 - alpha lie within [${err.lowest}, ${err.highest}]` }]);
    }
    throw err;
  }
}

interface SummaryContext {
  readonly day: string;
  readonly flags: PlanFlags;
  readonly paths: Record<'market' | 'battery' | 'forecast', string>;
  readonly market: MarketSpec;
  readonly forecastFile: QuantileForecastFile;
}

/** The content of plan.json and of `--json`: inputs, objective, solver status, order totals. */
function planSummary(result: Extract<PlanResult, { status: 'optimal' }>, context: SummaryContext) {
  const dt = result.problem.periodHours;
  const buys = result.orders.filter((o) => o.side === 'buy');
  const sells = result.orders.filter((o) => o.side === 'sell');
  const mwh = (orders: typeof buys) => orders.reduce((sum, o) => sum + o.quantityMw * dt, 0);
  const soc = result.outcome.schedule.socMwh;
  return {
    day: context.day,
    policy: context.flags.policy,
    alpha: context.flags.policy === 'point' ? null : context.flags.alpha,
    currency: context.market.currency,
    inputs: { ...context.paths },
    socStartMwh: result.problem.socStartMwh,
    socEndMwh: soc[soc.length - 1] ?? result.problem.socStartMwh,
    socEndMinMwh: result.problem.socEndMinMwh,
    objective: result.outcome.objective,
    expectedValueAtMedian: result.expectedValueAtMedian,
    solver: { status: result.outcome.status, method: result.outcome.solver, nodes: result.outcome.nodes },
    orders: { buys: buys.length, sells: sells.length, boughtMwh: mwh(buys), soldMwh: mwh(sells) },
    forecast: {
      levels: context.forecastFile.levels,
      repairedPeriodsInFile: context.forecastFile.repairedPeriods,
      repairedExamples: context.forecastFile.repairedExamples,
    },
  };
}
