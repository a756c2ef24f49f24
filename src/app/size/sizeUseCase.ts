import { z } from 'zod';
import { daysBetween } from '../../market/calendar.js';
import { ALPHA_RANGE, isAlpha } from '../../plan/alpha.js';
import { sizeReport } from '../../report/sizeReport.js';
import type { AlphaMode } from '../../sizing/alphaChoice.js';
import type { SizeResult } from '../../sizing/bestSizes.js';
import { specRoundTripEfficiency } from '../../sizing/scaledBattery.js';
import type { SizeCosts } from '../../sizing/sizeEconomics.js';
import { SIZE_POLICIES, type SizePolicy } from '../../sizing/sizeSettingRow.js';
import { SIZE_DEFAULTS } from '../commandDefaults.js';
import type { Done, Interrupted } from '../commandResult.js';
import { lockedGridRun, runGridCommand } from '../gridRun.js';
import { eachOnce, gridRunSettings, parseAxes, parseNumberAxis, parseWordAxis } from '../gridSettings.js';
import { shareInputs } from '../../io/sharedInputs.js';
import { inputDataSpan } from '../inputDataSpan.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { BATTERY_LIMITS } from '../../battery/batterySpec.js';
import { RUN_LIMITS } from '../settingRules.js';
import { alphaSchema, boundedNumber, checkSpan, daySchema, spanProblem, unacceptedRuleSchema, validSettings } from '../settingSchemas.js';
import { gridScenarioInput } from '../scenarios/gridScenarios.js';
import { scenarioSettingsSchema } from '../scenarios/scenarioSettings.js';
import { sizeSummary, sizeSummaryText } from './sizeSummary.js';
import type { SizeTaskInput } from './sizeTask.js';

export { SIZE_DEFAULTS } from '../commandDefaults.js';

/** Whether a number lies in [lo, hi]. */
const within =
  ([lo, hi]: readonly [number, number]) =>
  (x: number): boolean =>
    x >= lo && x <= hi;

/** The size axes and the alphas of `--alpha best` from their text, every problem listed together; an axis whose text is undefined is left out. */
export function sizeAxesFromText(text: { readonly energyMwh?: string; readonly powerMw?: string; readonly efficiency?: string; readonly alphas?: string; readonly policies: string; readonly policiesOption?: string }) {
  const numbers = (name: string, option: string, spec: string | undefined, accept: (x: number) => boolean, expected: string) =>
    spec === undefined ? [] : [() => parseNumberAxis(name, option, spec, { accept, expected })];
  const axes = parseAxes([
    ...numbers('energy_mwh', '--energy-mwh', text.energyMwh, within(BATTERY_LIMITS.energyMwh), `an energy in [${BATTERY_LIMITS.energyMwh.join(', ')}] MWh`),
    ...numbers('power_mw', '--power-mw', text.powerMw, within(BATTERY_LIMITS.powerMw), `a power in [${BATTERY_LIMITS.powerMw.join(', ')}] MW`),
    ...numbers('round_trip_efficiency', '--efficiency', text.efficiency, within(BATTERY_LIMITS.efficiency), `an efficiency in [${BATTERY_LIMITS.efficiency.join(', ')}]`),
    ...numbers('alpha', '--alphas', text.alphas, isAlpha, `an alpha in ${ALPHA_RANGE}`),
    () => parseWordAxis('policy', text.policiesOption ?? '--policies', text.policies, SIZE_POLICIES),
  ]);
  const values = (name: string) => axes.find((axis) => axis.name === name)?.values;
  const numbersOf = (name: string) => (values(name) as readonly number[] | undefined)?.slice();
  return {
    energiesMwh: numbersOf('energy_mwh'),
    powersMw: numbersOf('power_mw'),
    efficiencies: numbersOf('round_trip_efficiency'),
    alphas: numbersOf('alpha'),
    policies: [...(values('policy') as readonly (typeof SIZE_POLICIES)[number][])],
  };
}

/**
 * The policy axis of size.csv: the policies asked for, then the baselines every size is read against,
 * price-taking (unless asked for) and perfect-foresight.
 */
export function sizePolicyAxis(policies: readonly (typeof SIZE_POLICIES)[number][]): SizePolicy[] {
  return [...policies, ...(policies.includes('price-taking') ? [] : ['price-taking' as const]), 'perfect-foresight'];
}

/** The alphas `--alpha best` chooses from when none are given: SIZE_DEFAULTS.alphas. */
function defaultBestAlphas(): number[] {
  return sizeAxesFromText({ alphas: SIZE_DEFAULTS.alphas, policies: SIZE_DEFAULTS.policies }).alphas ?? [];
}

/** `--alpha best` chooses on the first half of the days and scores on the second: it needs two days or more. */
export function alphaBestSpanProblem(from: string, to: string): string | null {
  return daysBetween(from, to).length < 2 ? 'best needs at least 2 days: it chooses on the first half and scores on the second' : null;
}

/** Costs and finance of the project, the same for every size (sizing/sizeEconomics.ts). */
export const sizeCostsSchema = z.strictObject({
  capexPerMwh: boundedNumber(RUN_LIMITS.capexPerMwh),
  capexPerMw: boundedNumber(RUN_LIMITS.capexPerMw),
  fixedOmPerMwYear: boundedNumber(RUN_LIMITS.fixedOmPerMwYear).default(SIZE_DEFAULTS.fixedOmPerMwYear),
  lifeYears: boundedNumber(RUN_LIMITS.lifeYears, true),
  lifeCycles: boundedNumber(RUN_LIMITS.lifeCycles).nullable().default(null),
  discountRate: boundedNumber(RUN_LIMITS.discountRate),
});

/** The settings of `quantbid size`, checked once when the sizing starts; worker threads get them typed. */
export const sizeSettingsSchema = z
  .strictObject({
    ...gridRunSettings,
    /** First and last delivery day, YYYY-MM-DD, both included. */
    from: daySchema,
    to: daySchema,
    /** The energy axis [MWh], each in BATTERY_LIMITS.energyMwh. */
    energiesMwh: eachOnce(boundedNumber(BATTERY_LIMITS.energyMwh)),
    /** The power axis [MW], charge = discharge, each in BATTERY_LIMITS.powerMw. */
    powersMw: eachOnce(boundedNumber(BATTERY_LIMITS.powerMw)),
    /** Round-trip efficiencies in BATTERY_LIMITS.efficiency; default the battery spec's. */
    efficiencies: eachOnce(boundedNumber(BATTERY_LIMITS.efficiency)).optional(),
    /** Policies scored; price-taking and perfect-foresight rows are always added (the baselines every size is read against). */
    policies: eachOnce(z.enum(SIZE_POLICIES)),
    /** Alpha of the quantile and median policies, or `best`: chosen per size on the first half of the days. */
    alpha: z.union([alphaSchema, z.literal('best')]).default(SIZE_DEFAULTS.alpha),
    /** The alphas `best` chooses from; default 0.05 to 0.45 in steps of 0.05. */
    alphas: eachOnce(alphaSchema).optional(),
    /** What the battery does about unaccepted orders; default follow-plan. */
    unaccepted: unacceptedRuleSchema.default(SIZE_DEFAULTS.unaccepted),
    costs: sizeCostsSchema,
    /** Paths and settings of curve and auto (required when the policy axis holds either). */
    scenarios: scenarioSettingsSchema.optional(),
  })
  .superRefine((s, ctx) => {
    checkSpan(s, ctx);
    if (s.alpha !== 'best' && s.alphas !== undefined) ctx.addIssue({ code: 'custom', path: ['alphas'], message: 'is used only with --alpha best' });
    const best = s.alpha === 'best' && spanProblem(s.from, s.to) === null ? alphaBestSpanProblem(s.from, s.to) : null;
    if (best !== null) ctx.addIssue({ code: 'custom', path: ['alpha'], message: best });
  });

export type SizeSettings = z.input<typeof sizeSettingsSchema>;

export type SizeSummary = ReturnType<typeof sizeSummary>;

/**
 * `quantbid size`: a backtest of every battery size of the grid energy x power [x efficiency] for
 * each policy, valued as a project (NPV, IRR, payback) on the grid engine, into size.csv,
 * summary.json and, when asked, report.html.
 */
export async function sizeUseCase(settings: SizeSettings, hooks: RunHooks = QUIET_HOOKS): Promise<Done<SizeSummary> | Interrupted> {
  const s = validSettings(sizeSettingsSchema, settings, 'size');
  const { from, to } = s;
  const costs: SizeCosts = s.costs;
  const alpha: AlphaMode = s.alpha === 'best' ? { method: 'best', alphas: s.alphas ?? defaultBestAlphas() } : { method: 'fixed', alpha: s.alpha };
  const alphas = alpha.method === 'fixed' ? [alpha.alpha] : alpha.alphas;
  const use = { policies: s.policies, alphas, alphaOption: alpha.method === 'fixed' ? '--alpha' : '--alphas', policyOption: '--policies' };
  const outcome = await lockedGridRun(s, 'size', use, hooks, ({ paths, data, model }, lock) => {
    const modelContext = model === undefined ? {} : { forecastModel: model.summary };
    const axes = [
      { name: 'energy_mwh', option: '--energy-mwh', values: s.energiesMwh },
      { name: 'power_mw', option: '--power-mw', values: s.powersMw },
      { name: 'round_trip_efficiency', option: '--efficiency', values: s.efficiencies ?? [specRoundTripEfficiency(data.batterySpec)] },
      { name: 'policy', option: '--policies', values: sizePolicyAxis(s.policies) },
    ] as const;
    const scenarios = gridScenarioInput(s.policies, s.scenarios, { data, marketFile: paths.market, from, to });
    // The workers get the inputs as read here, cut to the span (whole with curve or auto, whose imbalance
    // spread is learnt from the history before each day) and shared: none reads or parses a file again.
    const contextInput: SizeTaskInput = {
      paths, from, to, alpha, unaccepted: s.unaccepted, costs, efficiencyGiven: s.efficiencies !== undefined,
      shared: shareInputs(scenarios === undefined ? inputDataSpan(data, from, to) : data),
      ...(scenarios === undefined ? {} : { scenarios }),
    };
    return runGridCommand(
      {
        command: 'size',
        run: s,
        lock,
        axes,
        taskModule: new URL('./sizeTask.js', import.meta.url),
        contextInput,
        identity: { from, to, alpha, unaccepted: s.unaccepted, costs, efficiencyGiven: contextInput.efficiencyGiven, ...(scenarios === undefined ? {} : { scenarios: scenarios.settings }) },
        paths,
        moreInputFiles: scenarios?.settings.paths === undefined ? [] : [scenarios.settings.paths],
        model,
        summary: (results: readonly SizeResult[]) => sizeSummary(results, { from, to, data, paths, axes, alpha, unaccepted: s.unaccepted, costs, ...modelContext, ...(scenarios === undefined ? {} : { scenarioPaths: scenarios.source }) }),
        report: (results, summary) => sizeReport({ results, summary }),
        summaryText: sizeSummaryText,
      },
      hooks,
    );
  });
  if (outcome.status === 'done' && outcome.summary.yearlyFigures.warning !== null) hooks.note(`warning: ${outcome.summary.yearlyFigures.warning}\n`);
  return outcome;
}
