import { z } from 'zod';
import { SWEEP_POLICIES, sweepReferenceSettings, type SweepReferenceRow, type SweepResult } from '../../backtest/sweepSettingRow.js';
import type { Done, Interrupted } from '../commandResult.js';
import { eachOnce, gridRunSettings, parseAxes, parseNumberAxis, parseWordAxis } from '../gridSettings.js';
import { lockedGridRun, runGridCommand } from '../gridRun.js';
import type { PoolWorkers } from '../../grid/workerPool.js';
import { shareInputs } from '../../io/sharedInputs.js';
import { inputDataSpan } from '../inputDataSpan.js';
import { QUIET_HOOKS, type RunHooks } from '../runHooks.js';
import { alphaSchema, checkSpan, daySchema, unacceptedRuleSchema, validSettings } from '../settingSchemas.js';
import { ALPHA_RANGE, isAlpha } from '../../plan/alpha.js';
import { UNACCEPTED_RULES } from '../../settle/settleDay.js';
import { gridScenarioInput } from '../scenarios/gridScenarios.js';
import { scenarioSettingsSchema } from '../scenarios/scenarioSettings.js';
import { sweepSummary, sweepSummaryText } from './sweepSummary.js';
import type { SweepTaskInput } from './sweepTask.js';

export { SWEEP_DEFAULTS } from '../commandDefaults.js';

/** The axes of a sweep from their text (`--alphas 0.05:0.45:0.05`, `--policies quantile,median`, ...), every problem listed together. */
export function sweepAxesFromText(text: { readonly alphas: string; readonly policies: string; readonly unaccepted: string }) {
  const [alphas, policies, unaccepted] = parseAxes([
    () => parseNumberAxis('alpha', '--alphas', text.alphas, { accept: isAlpha, expected: `an alpha in ${ALPHA_RANGE}` }),
    () => parseWordAxis('policy', '--policies', text.policies, SWEEP_POLICIES),
    () => parseWordAxis('unaccepted', '--unaccepted', text.unaccepted, UNACCEPTED_RULES),
  ]);
  return { alphas: [...alphas.values], policies: [...policies.values], unaccepted: [...unaccepted.values] };
}

/** The settings of `quantbid sweep`, checked once when the sweep starts; worker threads get them typed. */
export const sweepSettingsSchema = z
  .strictObject({
    ...gridRunSettings,
    /** First and last delivery day, YYYY-MM-DD, both included. */
    from: daySchema,
    to: daySchema,
    /** The alpha axis: tail levels, each in (0, 0.5). */
    alphas: eachOnce(alphaSchema),
    /** The policy axis: quantile and median, whose orders depend on alpha, and curve and auto, which ignore it. */
    policies: eachOnce(z.enum(SWEEP_POLICIES)),
    /** Paths and settings of curve and auto (required when the policy axis holds either). */
    scenarios: scenarioSettingsSchema.optional(),
    /** The axis of rules for unaccepted orders. */
    unaccepted: eachOnce(unacceptedRuleSchema),
  })
  .superRefine(checkSpan);

export type SweepSettings = z.input<typeof sweepSettingsSchema>;

export type SweepSummary = ReturnType<typeof sweepSummary>;

/**
 * `quantbid sweep`: a backtest of every setting of the grid alpha x policy x unaccepted rule on the
 * grid engine (this thread and worker threads, resumable), into sweep.csv, summary.json and, when
 * asked, report.html. `workers`, started ahead with startSweepWorkers(settings.threads), boot while
 * the inputs are read; they are stopped however the sweep ends.
 */
export async function sweepUseCase(settings: SweepSettings, hooks: RunHooks = QUIET_HOOKS, workers?: PoolWorkers): Promise<Done<SweepSummary> | Interrupted> {
  try {
    return await sweepOnWorkers(settings, hooks, workers);
  } finally {
    await workers?.stop();
  }
}

async function sweepOnWorkers(settings: SweepSettings, hooks: RunHooks, workers: PoolWorkers | undefined): Promise<Done<SweepSummary> | Interrupted> {
  const s = validSettings(sweepSettingsSchema, settings, 'sweep');
  const { from, to } = s;
  const axes = [
    { name: 'alpha', option: '--alphas', values: s.alphas },
    { name: 'policy', option: '--policies', values: s.policies },
    { name: 'unaccepted', option: '--unaccepted', values: s.unaccepted },
  ] as const;
  const use = { policies: s.policies, alphas: s.alphas, alphaOption: '--alphas', policyOption: '--policies' };
  // The report's code loads only when report.html is asked for.
  const { sweepReport } = s.report ? await import('../../report/sweepReport.js') : { sweepReport: undefined };
  return lockedGridRun(s, 'sweep', use, hooks, ({ paths, data, model }, lock) => {
    const modelContext = model === undefined ? {} : { forecastModel: model.summary };
    const scenarios = gridScenarioInput(s.policies, s.scenarios, { data, marketFile: paths.market, from, to });
    // The workers get the inputs as read here, cut to the span (whole with curve or auto, whose imbalance
    // spread is learnt from the history before each day) and shared: none reads or parses a file again.
    const span = inputDataSpan(data, from, to);
    const contextInput: SweepTaskInput = { paths, from, to, shared: shareInputs(scenarios === undefined ? span : data), ...(scenarios === undefined ? {} : { scenarios }) };
    return runGridCommand(
      {
        command: 'sweep',
        run: s,
        lock,
        axes,
        taskModule: new URL('./sweepTask.js', import.meta.url),
        contextInput,
        identity: { from, to, ...(scenarios === undefined ? {} : { scenarios: scenarios.settings }) },
        paths,
        moreInputFiles: scenarios?.settings.paths === undefined ? [] : [scenarios.settings.paths],
        model,
        summary: (results: readonly SweepResult[], references) =>
          sweepSummary(results, { from, to, data, paths, axes, references: references as readonly SweepReferenceRow[], ...modelContext, ...(scenarios === undefined ? {} : { scenarioPaths: scenarios.source }) }),
        // The reference rows (point, price-taking, perfect foresight per rule) run as settings; a thread
        // keeps to one rule while it can, so that it runs that rule's references once for all its settings.
        moreSettings: sweepReferenceSettings(s.unaccepted),
        groupOf: (setting) => String(setting.unaccepted),
        ...(workers === undefined ? {} : { workers }),
        report: (results, summary) => {
          if (sweepReport === undefined) throw new Error('sweep: report.html asked for without its code loaded');
          return sweepReport({ results, summary });
        },
        summaryText: sweepSummaryText,
      },
      hooks,
    );
  });
}
