/**
 * Public types of the chart module. Every chart takes plain readonly data and returns Markup
 * (an escaped `<figure>` holding one `<svg>`); nothing here touches the DOM.
 */

/** A quantity shown on an axis or in a legend: printed as `label [unit]`. */
export interface Quantity {
  /** What is measured, in the vocabulary of docs/design.md section 2, e.g. `price`, `state of charge`. */
  readonly label: string;
  /** Its unit, e.g. `HLV/MWh`, `MW`, `-` for a pure number. */
  readonly unit: string;
}

/** A value axis (y, or a numeric x). Its domain is the data widened to nice ticks unless fixed. */
export interface ValueAxis extends Quantity {
  /** Fixed lower end of the axis [unit]. Default: the nice tick at or below the data. */
  readonly min?: number;
  /** Fixed upper end of the axis [unit]. Default: the nice tick at or above the data. */
  readonly max?: number;
  /** Stretch the axis to show 0. Default false (bars always include 0). */
  readonly includeZero?: boolean;
}

/** A numeric x axis of a line chart: `values[i]` is the x of point i of every series. */
export interface NumberAxis extends ValueAxis {
  readonly kind: 'linear';
  readonly values: readonly number[];
}

/** A labelled tick of a band axis. */
export interface BandTick {
  /** Position in bands: 0 is the start of band 0, i + 0.5 the centre of band i, count the end. */
  readonly at: number;
  readonly label: string;
}

/**
 * An axis of equal bands: delivery periods (periodAxis) or categories such as days or grid values
 * (categoryAxis). Data of a band axis are indexed by band.
 */
export interface BandAxis {
  readonly kind: 'band';
  readonly title: Quantity;
  /** Full text of each band (tooltips); its length is the number of bands. */
  readonly bandLabels: readonly string[];
  /** Candidate tick sets from the densest to the sparsest; a chart shows the first that fits. */
  readonly tickSets: readonly (readonly BandTick[])[];
}

/** Shapes of point markers. */
export type MarkerShape = 'circle' | 'square' | 'diamond' | 'triangle-up' | 'triangle-down';

/** How a legend entry is drawn. */
export type LegendSwatch =
  | { readonly kind: 'line'; readonly colour: string; readonly dash?: boolean }
  | { readonly kind: 'area'; readonly colour: string; readonly opacity: number }
  | { readonly kind: 'bar'; readonly colour: string }
  | { readonly kind: 'marker'; readonly colour: string; readonly shape: MarkerShape }
  | { readonly kind: 'outline'; readonly colour: string };

export interface LegendEntry {
  readonly label: string;
  readonly swatch: LegendSwatch;
}

/** A horizontal reference line across the plot at `value`, e.g. a state-of-charge limit. */
export interface Guide {
  readonly value: number;
  /** Short text printed at the right end of the line. */
  readonly label: string;
  /** Which y axis the value is on. Default `left`. */
  readonly axis?: 'left' | 'right';
}

/** Options every chart takes. */
export interface ChartBase {
  /** Id of the `<svg>`, unique in the page: lower-case letters, digits and hyphens, starting with a letter. */
  readonly id: string;
  /** Title printed at the top of the chart. */
  readonly title: string;
  /** One line saying how to read the chart (what the marks are); wrapped if too long. */
  readonly caption: string;
  /** Width of the drawing [px]; the chart scales down on narrow screens. Default 960. */
  readonly width?: number;
  /** Height of the plot area [px], without title, legend, axes and caption. Default 240. */
  readonly plotHeight?: number;
}

export const CHART_DEFAULTS = Object.freeze({ width: 960, plotHeight: 240 });
