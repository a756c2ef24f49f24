import { z } from 'zod';
import { parseAxes, parseNumberAxis, parseWordAxis } from '../grid/gridAxis.js';
import { RUN_LIMITS } from './settingRules.js';
import { boundedNumber, inputSourcesSchema, modelSettingsSchema, outFolderSchema } from './settingSchemas.js';

export { parseAxes, parseNumberAxis, parseWordAxis };

/** A list whose items are each given once. */
export function eachOnce<Item extends z.ZodType>(item: Item) {
  return z
    .array(item)
    .min(1)
    .refine((list) => new Set(list).size === list.length, 'each value may be given once');
}

/** The settings sweep and size share besides their axes: inputs, --model, span and the run options. */
export const gridRunSettings = {
  /** The market, battery, history and forecast files, or a scenario naming them. */
  inputs: inputSourcesSchema,
  /** Make the forecasts from the history instead of reading a forecast file. */
  model: modelSettingsSchema.optional(),
  /** Threads running settings, this one included; default the number of CPUs. */
  threads: boundedNumber(RUN_LIMITS.threads, true).optional(),
  /** Discard the journal of an interrupted run in `out` and start over; default resume it. */
  restart: z.boolean().default(false),
  /** Folder for the table and summary.json (and report.html). */
  out: outFolderSchema,
  /** Overwrite existing outputs. */
  force: z.boolean().default(false),
  /** Also write report.html. */
  report: z.boolean().default(false),
};
