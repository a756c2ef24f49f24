import type { DayRange } from '../sizing/alphaChoice.js';
import type { SizeCosts } from '../sizing/sizeEconomics.js';

/**
 * What the sweep and size reports read: the finished settings with their rows, and the parts of the
 * grid's summary.json they show (app/gridSummary.ts, app/sweep/sweepSummary.ts,
 * app/size/sizeSummary.ts write the whole summary; these types name only what a page draws).
 */

/** A cell of a row of sweep.csv or size.csv: a number, a word (`none`, `never`), a flag, or empty. */
export type ResultCell = number | string | boolean | null;

/** A finished setting of a grid: its value per axis name and its row of result columns. */
export interface SettingResult {
  readonly setting: Readonly<Record<string, number | string>>;
  readonly row: Readonly<Record<string, ResultCell>>;
}

/** The head of a grid's summary.json: span, days, currency, inputs, axes, settings, the note on reading it. */
export interface GridSummaryHead {
  readonly from: string;
  readonly to: string;
  readonly daysCovered: number;
  readonly skippedDays: readonly string[];
  readonly currency: string;
  readonly inputs: Readonly<Record<string, string | undefined>>;
  /** Values of each axis in grid order, by axis name. */
  readonly axes: Readonly<Record<string, readonly (number | string)[]>>;
  readonly settings: number;
  readonly note: string;
}

/** The sweep's summary.json as the sweep report reads it. */
export interface SweepReportSummary extends GridSummaryHead {
  /** Per unaccepted rule, the most profitable setting and the strongest simple baseline it is read against. */
  readonly bestByRule: readonly {
    readonly unaccepted: number | string;
    readonly best: SettingResult | null;
    readonly strongestBaseline: { readonly policy: string; readonly profit: number } | null;
    readonly beatsStrongestBaseline: boolean | null;
    readonly perfectForesightProfit: number | null;
  }[];
  readonly bestAlphaByPolicy: readonly {
    readonly policy: number | string;
    readonly unaccepted: number | string;
    readonly alpha: number | string | null;
    readonly row: Readonly<Record<string, ResultCell>> | null;
    readonly onEdgeOfAlphaGrid: boolean;
  }[];
  /** The reference policies' rows per rule (point, price-taking, perfect-foresight). */
  readonly references: readonly { readonly policy: string; readonly unaccepted: string; readonly row: Readonly<Record<string, ResultCell>> }[];
  readonly warnings: readonly string[];
}

/** A size the sizing summary picked, with its row and the NPV of its grid neighbours. */
export interface PickedSize {
  readonly energyMwh: number;
  readonly powerMw: number;
  readonly roundTripEfficiency: number;
  readonly row: Readonly<Record<string, ResultCell>>;
}

/** The sizing's summary.json as the size report reads it. */
export interface SizeReportSummary extends GridSummaryHead {
  readonly unaccepted: string;
  readonly alpha: ({ readonly method: 'fixed'; readonly alpha: number } | { readonly method: 'best'; readonly alphas: readonly number[]; readonly choose: DayRange }) & {
    readonly scored: DayRange & { readonly days: readonly string[] };
  };
  readonly economics: SizeCosts & { readonly steps: readonly string[] };
  /** What an owner must know before reading the best size as an answer (extrapolated years, losses, grid edges). */
  readonly warnings: readonly string[];
  readonly best: readonly { readonly policy: string; readonly highestNpv: PickedSize | null; readonly highestIrr: PickedSize | null }[];
}
