import { mixHex } from './colour.js';

/**
 * The eight colours of Okabe and Ito's colour-blind-safe palette: M. Okabe and K. Ito (2008),
 * "Color Universal Design (CUD): how to make figures and presentations that are friendly to
 * colorblind people", J*FLY, https://jfly.uni-koeln.de/color/ (the RGB values
 * they publish for the set).
 * They stay distinguishable for protan, deutan and tritan colour vision; charts add a second cue
 * (marker shape, dash) wherever two colours carry meaning.
 */
export const OKABE_ITO = Object.freeze({
  black: '#000000',
  orange: '#e69f00',
  skyBlue: '#56b4e9',
  bluishGreen: '#009e73',
  yellow: '#f0e442',
  blue: '#0072b2',
  vermillion: '#d55e00',
  reddishPurple: '#cc79a7',
});

/** Default colours of series, in order (yellow last: it is faint on white). */
export const SERIES_COLOURS: readonly string[] = Object.freeze([
  OKABE_ITO.blue,
  OKABE_ITO.orange,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.vermillion,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.skyBlue,
  OKABE_ITO.black,
  OKABE_ITO.yellow,
]);

/** The colour of series i: SERIES_COLOURS, repeating. */
export function seriesColour(i: number): string {
  return SERIES_COLOURS[i % SERIES_COLOURS.length] as string;
}

/**
 * Colours with a meaning in quantbid's charts: buying (charging) and selling (discharging) keep one
 * colour each on every page; the forecast is blue, with lighter tints for wider intervals.
 */
export const ROLE_COLOURS = Object.freeze({
  buy: OKABE_ITO.bluishGreen,
  sell: OKABE_ITO.vermillion,
  forecast: OKABE_ITO.blue,
  median: OKABE_ITO.black,
  stateOfCharge: OKABE_ITO.blue,
});

/** Greys of the page and the chart frame (each >= 4.5:1 on white where it carries text, WCAG 2.1 AA). */
export const INK = Object.freeze({
  text: '#1a1a1a',
  muted: '#595959',
  axis: '#595959',
  grid: '#e2e2e2',
  guide: '#767676',
  paper: '#ffffff',
  missing: '#e8e8e8',
});

/** A tint of `colour` mixed with white: 0 gives white, 1 the colour itself. */
export function tint(colour: string, amount: number): string {
  return mixHex(INK.paper, colour, amount);
}
