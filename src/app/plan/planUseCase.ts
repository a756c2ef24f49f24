import { z } from 'zod';
import { batteryModel } from '../../battery/batterySpec.js';
import { gatherProblems, InputError, throwIfProblems, type InputProblem } from '../../errors/inputError.js';
import { jsonText, ordersCsv, scheduleCsv } from '../../io/planOutputs.js';
import { readQuantileForecast, type QuantileForecastFile } from '../../io/readQuantileForecast.js';
import { readBatterySpec, readMarketSpec } from '../../io/readSpecs.js';
import type { OutputLock } from '../../io/outputLock.js';
import { checkOutputFolder, writeOutputs } from '../../io/writeOutputs.js';
import { PLAN_POLICIES } from '../../plan/alpha.js';
import { isSkippedDay } from '../../market/calendar.js';
import { planDay } from '../../plan/planDay.js';
import { planReport } from '../../report/planReport.js';
import type { BatteryModel, MarketSpec, PlanPolicy, QuantileDay } from '../../types.js';
import type { Done } from '../commandResult.js';
import { forecastLevelProblems } from '../forecastLevels.js';
import { inputFiles, runInputFiles } from '../inputFiles.js';
import { lockedRun } from '../lockedRun.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { RUN_LIMITS } from '../settingRules.js';
import { alphaSchema, boundedNumber, daySchema, inputSourcesSchema, outFolderSchema, validSettings } from '../settingSchemas.js';
import { planSummary, planSummaryText } from './planSummary.js';

/** Defaults of `quantbid plan`: the quantile policy at alpha 0.1. */
export const PLAN_DEFAULTS = Object.freeze({ alpha: 0.1, policy: 'quantile' as PlanPolicy });

/** The settings of `quantbid plan`, checked once when the plan starts. */
export const planSettingsSchema = z.strictObject({
  /** The market, battery and forecast files, or a scenario naming them. */
  inputs: inputSourcesSchema,
  /** Delivery day to plan, YYYY-MM-DD; default the scenario's demoDay. */
  day: daySchema.optional(),
  /** Central interval [q(alpha), q(1 - alpha)]; default 0.1. */
  alpha: alphaSchema.default(PLAN_DEFAULTS.alpha),
  /** Planning policy; default quantile. */
  policy: z.enum(PLAN_POLICIES as readonly PlanPolicy[] as [PlanPolicy, ...PlanPolicy[]]).default(PLAN_DEFAULTS.policy),
  /** State of charge at the start of the day [MWh]; default socInitialFraction x energyMwh. */
  socStartMwh: boundedNumber(RUN_LIMITS.socStartMwh).optional(),
  /** Folder for orders.csv, schedule.csv, plan.json (and report.html); none: nothing is written. */
  out: outFolderSchema.optional(),
  /** Overwrite existing outputs. */
  force: z.boolean().default(false),
  /** Also write report.html (needs `out`). */
  report: z.boolean().default(false),
});

export type PlanSettings = z.input<typeof planSettingsSchema>;

export type PlanSummary = ReturnType<typeof planSummary>;

const PLAN_OUTPUTS = ['orders.csv', 'schedule.csv', 'plan.json'] as const;

/**
 * `quantbid plan`: one delivery day's orders and schedule from the quantile forecast (planDay), written
 * as orders.csv, schedule.csv, plan.json and, when asked, report.html into `out` as one output set.
 */
export function planUseCase(settings: PlanSettings, hooks: RunHooks = QUIET_HOOKS): Done<PlanSummary> {
  const s = validSettings(planSettingsSchema, settings, 'plan');
  const { paths, demoDay } = inputFiles(s.inputs, ['market', 'battery', 'forecast']);
  const day = s.day ?? demoDay;
  if (day === undefined) {
    throw new InputError([{ file: 'command line', field: '--day', message: 'no delivery day given', fix: 'give --day YYYY-MM-DD' }]);
  }
  if (s.report && s.out === undefined) {
    throw new InputError([{ file: 'command line', field: '--report', message: 'report.html needs a folder to go to', fix: 'add --out DIR' }]);
  }
  const outputs = s.report ? [...PLAN_OUTPUTS, 'report.html'] : PLAN_OUTPUTS;
  if (s.out !== undefined) checkOutputFolder(s.out, outputs, s.force, runInputFiles(s.inputs, paths));
  return lockedRun(s.out, 'plan', (lock) => planDayRun(s, { paths, day, outputs, lock }, hooks));
}

/** The plan of `day` from the checked settings, written under the output folder's lock (when there is a folder). */
function planDayRun(
  s: z.output<typeof planSettingsSchema>,
  run: { readonly paths: Record<'market' | 'battery' | 'forecast', string>; readonly day: string; readonly outputs: readonly string[]; readonly lock: OutputLock | undefined },
  hooks: RunHooks,
): Done<PlanSummary> {
  const { paths, day, outputs } = run;
  const { market, battery, forecastFile } = readPlanInputs(paths, (text) => hooks.note(text));
  const forecast = forecastDay(forecastFile, day, market.timeZone);
  const socStartMwh = s.socStartMwh ?? battery.socInitialMwh;
  if (s.socStartMwh !== undefined && (socStartMwh < battery.socMinMwh || socStartMwh > battery.socMaxMwh)) {
    throw new InputError([{ file: 'command line', field: '--soc-start', message: `${socStartMwh} MWh is outside the battery's window [${battery.socMinMwh}, ${battery.socMaxMwh}] MWh`, fix: 'give a state of charge inside the window' }]);
  }
  throwIfProblems(forecastLevelProblems(forecastFile.levels, forecastFile.file, { policies: [s.policy], alphas: [s.alpha], alphaOption: '--alpha', policyOption: '--policy' }));
  const result = planDay({ forecast, market, battery, policy: s.policy, alpha: s.alpha, socStartMwh });
  if (result.status !== 'optimal') {
    throw new InputError([{ file: paths.battery, message: `no feasible plan for ${day}: ${result.reason}`, fix: 'check the battery spec and --soc-start' }]);
  }
  const summary = planSummary(result, { day, policy: s.policy, alpha: s.alpha, paths, market, forecastFile });
  if (s.out !== undefined) {
    writeOutputs(
      s.out,
      [
        { name: 'orders.csv', text: ordersCsv(result.orders) },
        { name: 'schedule.csv', text: scheduleCsv(forecast.periods, result.outcome.schedule) },
        { name: 'plan.json', text: jsonText(summary) },
        ...(s.report ? [{ name: 'report.html', text: planReport({ day, policy: s.policy, alpha: s.alpha, market, forecast, plan: result, inputs: paths }) }] : []),
      ],
      s.force,
      ['report.html'],
      run.lock,
    );
  }
  // Repaired, not refused (docs/design.md section 6); a note, so that --json output stays clean.
  if (forecastFile.repairedPeriods > 0) {
    hooks.note(`note: ${paths.forecast}: ${forecastFile.repairedPeriods} periods had crossing quantiles, sorted into order (monotone rearrangement), e.g. ${forecastFile.repairedExamples[0] ?? ''}\n`);
  }
  return { status: 'done', summary, text: planSummaryText(result, forecast, market, day, s, s.out, outputs) };
}

/**
 * The market spec, the battery and the forecast (which needs the market). Every file is read even when
 * one before it has problems, and all problems are thrown together. `note` hears of an old field name
 * read under its new one.
 */
function readPlanInputs(paths: Record<'market' | 'battery' | 'forecast', string>, note: (text: string) => void): { market: MarketSpec; battery: BatteryModel; forecastFile: QuantileForecastFile } {
  const problems: InputProblem[] = [];
  const market = gatherProblems(problems, () => readMarketSpec(paths.market, note));
  const spec = gatherProblems(problems, () => readBatterySpec(paths.battery));
  const forecastFile = market === undefined ? undefined : gatherProblems(problems, () => readQuantileForecast(paths.forecast, market));
  if (market === undefined || spec === undefined || forecastFile === undefined) throw new InputError(problems);
  return { market, battery: batteryModel(spec), forecastFile };
}

function forecastDay(file: QuantileForecastFile, day: string, timeZone: string): QuantileDay {
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
