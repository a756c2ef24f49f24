/**
 * The pieces of the use cases' settings schemas that several commands share, built on settingRules.ts.
 * A use case validates its whole settings object once, at its start (validSettings); from there on the
 * values are typed and trusted, down to the grid's worker threads.
 */
import { z } from 'zod';
import { InputError } from '../errors/inputError.js';
import { FORECAST_METHODS } from '../forecast/forecastMethods.js';
import { isValidDay } from '../market/civilDays.js';
import { ALPHA_RULE, isAlpha } from '../plan/alpha.js';
import { UNACCEPTED_RULES, type UnacceptedRule } from '../settle/settleDay.js';
import { levelsProblem, outFolderProblem, pathProblem, rangeProblem, spanProblem } from './settingRules.js';

export { spanProblem } from './settingRules.js';

/** A delivery day, YYYY-MM-DD. */
export const daySchema = z.string().refine(isValidDay, 'must be a day YYYY-MM-DD, e.g. 2027-03-28');

/** The tail level alpha: buys limited at q(1 - alpha), sells at q(alpha); [q(alpha), q(1 - alpha)] covers 1 - 2 alpha. */
export const alphaSchema = z.number().refine(isAlpha, `alpha must be ${ALPHA_RULE}`);

/** A file path: not empty. */
export const pathSchema = z.string().superRefine((path, ctx) => {
  const problem = pathProblem(path);
  if (problem !== null) ctx.addIssue({ code: 'custom', message: problem });
});

/** The folder a command writes into: not empty, not the root folder. */
export const outFolderSchema = z.string().superRefine((out, ctx) => {
  const problem = outFolderProblem(out);
  if (problem !== null) ctx.addIssue({ code: 'custom', message: problem });
});

/** Quantile levels of a forecast: in (0, 1), strictly increasing, at most MAX_LEVELS. */
export const levelsSchema = z.array(z.number()).superRefine((levels, ctx) => {
  const problem = levelsProblem(levels);
  if (problem !== null) ctx.addIssue({ code: 'custom', message: problem });
});

/** What the battery does about unaccepted orders. */
export const unacceptedRuleSchema = z.enum(UNACCEPTED_RULES as readonly UnacceptedRule[] as [UnacceptedRule, ...UnacceptedRule[]]);

/**
 * Where the input files come from: each named on its own, or from a scenario file that names them
 * (paths relative to itself); a file named on its own wins over the scenario's.
 */
export const inputSourcesSchema = z.strictObject({
  scenario: pathSchema.optional(),
  market: pathSchema.optional(),
  battery: pathSchema.optional(),
  forecast: pathSchema.optional(),
  history: pathSchema.optional(),
});
export type InputSources = z.input<typeof inputSourcesSchema>;

/** Forecasts made from the history (`--model`) instead of read from a forecast file. */
export const modelSettingsSchema = z.strictObject({
  /** A forecast method of `quantbid forecast`. */
  method: z.enum(FORECAST_METHODS),
  /** The levels to forecast; default MODEL_DEFAULTS.levels (modelForecast.ts). */
  levels: levelsSchema.optional(),
  /** Folder of the forecast cache, or false for none; default MODEL_DEFAULTS.cacheDir. */
  cache: z.union([pathSchema, z.literal(false)]).optional(),
});
export type ModelSettings = z.input<typeof modelSettingsSchema>;

/** A number of the settings in [lo, hi] (a whole number when `whole`), with rangeProblem's words. */
export function boundedNumber(limits: readonly [number, number], whole = false) {
  return z.number().superRefine((value, ctx) => {
    const problem = rangeProblem(value, limits, whole);
    if (problem !== null) ctx.addIssue({ code: 'custom', message: `${value} ${problem}` });
  });
}

/** The span check of a settings schema (`.superRefine(checkSpan)`): a `to` before `from` is a problem of `to`. */
export function checkSpan(settings: { readonly from?: string | undefined; readonly to?: string | undefined }, ctx: z.RefinementCtx): void {
  const problem = settings.from === undefined || settings.to === undefined ? null : spanProblem(settings.from, settings.to);
  if (problem !== null) ctx.addIssue({ code: 'custom', path: ['to'], message: problem });
}

/**
 * The settings checked against their schema, or an InputError that names every wrong field (as
 * `settings: FIELD: what is wrong`); `command` names the command in the advice.
 */
export function validSettings<Schema extends z.ZodType>(schema: Schema, settings: unknown, command: string): z.output<Schema> {
  const result = schema.safeParse(settings);
  if (result.success) return result.data;
  throw new InputError(
    result.error.issues.map((issue) => ({
      file: 'settings',
      field: issue.path.map(String).join('.') || '(top level)',
      message: issue.message,
      fix: `see the settings of ${command} (the options of quantbid ${command} --help)`,
    })),
  );
}
