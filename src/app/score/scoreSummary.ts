import type { ForecastComparison } from '../../forecast/scoring/compareForecasts.js';
import type { IntervalCoverage, ScoreTable, Scores } from '../../forecast/scoring/scoreForecasts.js';
import type { PathScores } from '../../forecast/scoring/scorePaths.js';
import type { ScoreSummaryInput, UnscoredDay } from '../../report/scoreReport.js';
import { formatNumber, formatPValue } from '../../io/formatNumber.js';
import { studentTCdf } from '../../stats/studentTCdf.js';
import { levelText } from '../../io/quantileForecastCsv.js';

/** Significance level at which byPeriod rejections are counted [-]. */
const TEST_LEVEL = 0.05;

const NOTES = [
  'crps: the mean pinball loss over the levels and every scored period, each period counting once (a 100-period day weighs 100/96 of a 96-period one); the factor 2 is NOT included, so it approximates CRPS / 2 (multiply by 2 to compare with a CRPS) [currency/MWh]',
  'pinball.<level>: mean pinball loss rho_tau(y - q) = (y - q)(tau - 1{y < q}) over the periods [currency/MWh]',
  'coverage.<c>: share of realised prices y with q((1 - c) / 2) <= y <= q((1 + c) / 2), for each central interval whose two levels are in the forecast',
  'calibration.<level>: share of realised prices strictly below the quantile at that level (a calibrated forecast: the level)',
  'kupiec.<c>: Kupiec (1995) proportion-of-failures test, failure = y outside the central interval c, expected rate 1 - c; christoffersen.<c>: Christoffersen (1998) independence and conditional coverage tests of the failures in time order (first observation starts the chain)',
  'the overall tests pool every period of every day; failures within a day are dependent, so their p-values are too small: judge calibration by the per-period tests (byPeriod, one sequence over the days per period of the day) and periodsRejectedAt5pct',
  'periods of the day are local clock times: on a 25-hour day both periods of the repeated hour count for its clock time, on a 23-hour day the skipped hour has one observation less',
];

/** Scores of a paths file (--paths), for score.json. */
export interface PathScoresInput {
  readonly file: string;
  readonly scores: PathScores;
  readonly unscoredDays: readonly UnscoredDay[];
}

const PATH_NOTES = [
  'paths.energyScore: mean over the days of the energy score of the day\'s paths, (1/n) sum_j ||x_j - y|| - (1/(2 n^2)) sum_{j,k} ||x_j - x_k|| over the periods (Gneiting and Raftery 2007) [currency/MWh]; lower is better',
  'paths.variogramScore: mean over the days of the variogram score of order 0.5, sum over ordered pairs of periods (|y_i - y_j|^0.5 - mean_m |x_mi - x_mj|^0.5)^2 (Scheuerer and Hamill 2015); lower is better',
  'paths.periodsIndependent: the same scores of the same paths with each period\'s values shuffled across the paths (seeded): the marginals without the dependence; scores above the paths\' own mean their dependence between periods helps',
];

/** The content of score.json (and of `quantbid score --json`). */
export function scoreSummary(input: ScoreSummaryInput, paths: PathScoresInput | null = null) {
  const { table } = input;
  return {
    notes: [...(input.comparison === null ? NOTES : [...NOTES, 'dieboldMariano: on the days both forecast, d = daily loss of --forecast minus that of --against, a day\'s loss being its crps summed over its periods divided by the mean number of periods per day, so that crpsForecast and crpsAgainst (the means of the daily losses) are the crps of those days as defined above; HLN-corrected DM with h = 1 referred to t(n - 1); pValueAgainstBetter tests E[d] > 0, pValueForecastBetter E[d] < 0; better names the forecast with the lower crps']), ...(paths === null ? [] : PATH_NOTES)],
    inputs: { ...input.inputs },
    currency: input.currency,
    levels: [...table.levels],
    days: {
      scored: input.days.length,
      first: input.days[0] ?? null,
      last: input.days[input.days.length - 1] ?? null,
      unscored: input.unscored.length,
      unscoredDays: input.unscored,
    },
    periods: table.overall.count,
    ...scoresJson(table.levels, table.overall),
    periodsOfTheDay: table.bySlot.filter((slot) => slot.count > 0).length,
    periodsRejectedAt5pct: periodsRejected(table),
    byPeriod: table.bySlot.map((slot) => ({ periodStart: slot.slotStart, periods: slot.count, ...scoresJson(table.levels, slot) })),
    dieboldMariano: input.comparison === null ? null : comparisonJson(input.comparison),
    paths:
      paths === null
        ? null
        : {
            file: paths.file,
            days: paths.scores.days,
            energyScore: paths.scores.energyScore,
            variogramScore: paths.scores.variogramScore,
            periodsIndependent: { ...paths.scores.periodsIndependent },
            unscored: paths.unscoredDays.length,
            unscoredDays: paths.unscoredDays,
          },
  };
}

function scoresJson(levels: readonly number[], scores: Scores) {
  const byLevel = (values: readonly number[]) => Object.fromEntries(levels.map((tau, k) => [levelText(tau), values[k] as number]));
  const byInterval = <T>(value: (c: IntervalCoverage) => T) => Object.fromEntries(scores.coverage.map((c) => [levelText(c.nominal), value(c)]));
  return {
    crps: scores.crps,
    pinball: byLevel(scores.pinball),
    coverage: byInterval((c) => c.observed),
    calibration: byLevel(scores.belowShare),
    kupiec: byInterval((c) => (c.kupiec === null ? null : { n: c.kupiec.n, failures: c.failures, expectedRate: c.kupiec.expectedRate, observedRate: c.kupiec.observedRate, lr: c.kupiec.lr, pValue: c.kupiec.pValue })),
    christoffersen: byInterval((c) => {
      const t = c.christoffersen;
      return t === null ? null : { ...t.counts, pi01: t.pi01, pi11: t.pi11, lrIndependence: t.lrIndependence, pValueIndependence: t.pValueIndependence, lrConditionalCoverage: t.lrConditionalCoverage, pValueConditionalCoverage: t.pValueConditionalCoverage };
    }),
  };
}

/** Per central interval: of the periods of the day, how many reject each test at TEST_LEVEL. */
function periodsRejected(table: ScoreTable) {
  const count = (i: number, pValue: (c: IntervalCoverage) => number | undefined): number =>
    table.bySlot.filter((slot) => {
      const c = slot.coverage[i];
      const p = c === undefined ? undefined : pValue(c);
      return p !== undefined && p < TEST_LEVEL;
    }).length;
  return Object.fromEntries(
    table.overall.coverage.map((interval, i) => [
      levelText(interval.nominal),
      {
        kupiec: count(i, (c) => c.kupiec?.pValue),
        christoffersenIndependence: count(i, (c) => c.christoffersen?.pValueIndependence),
        christoffersenConditionalCoverage: count(i, (c) => c.christoffersen?.pValueConditionalCoverage),
      },
    ]),
  );
}

function comparisonJson(c: ForecastComparison) {
  const t = c.test;
  return {
    days: c.days,
    crpsForecast: c.lossFirst,
    crpsAgainst: c.lossSecond,
    better: c.lossFirst < c.lossSecond ? 'forecast' : c.lossFirst > c.lossSecond ? 'against' : 'neither',
    status: t.status,
    meanDifference: t.meanDifference,
    ...(t.status === 'ok'
      ? { dm: t.dm, hln: t.hln, degreesOfFreedom: t.degreesOfFreedom, pValueTwoSided: t.pValueTwoSided, pValueAgainstBetter: t.pValueOneSided, pValueForecastBetter: studentTCdf(t.hln, t.degreesOfFreedom) }
      : { reason: t.reason }),
  };
}

/** The short human summary of `quantbid score`. */
export function scoreSummaryText(summary: ReturnType<typeof scoreSummary>, out: string, written: readonly string[] = ['score.json']): string {
  const pct = (x: number) => `${formatNumber(100 * x, 2)}%`;
  const money = (x: number) => `${formatNumber(x, 4)} ${summary.currency}/MWh`;
  const p = formatPValue;
  const lines = [
    `scored ${summary.days.scored} days (${summary.days.first} to ${summary.days.last}), ${summary.periods} periods; ${summary.days.unscored} forecast days not scored`,
    `  crps (mean pinball, = CRPS/2): ${money(summary.crps)}`,
    ...Object.entries(summary.coverage).map(([c, observed]) => {
      const kupiec = summary.kupiec[c];
      const rejected = summary.periodsRejectedAt5pct[c]?.kupiec ?? 0;
      return `  coverage ${pct(Number(c))}: ${pct(observed)}; Kupiec p ${kupiec === null || kupiec === undefined ? '-' : p(kupiec.pValue)} overall, rejected at 5% in ${rejected} of ${summary.periodsOfTheDay} periods of the day`;
    }),
  ];
  const dm = summary.dieboldMariano;
  if (dm !== null) {
    const which = dm.better === 'forecast' ? 'this forecast is better (lower crps)' : dm.better === 'against' ? 'the --against forecast is better (lower crps)' : 'neither is better';
    const oneSided = 'hln' in dm ? (dm.better === 'against' ? dm.pValueAgainstBetter : dm.pValueForecastBetter) : null;
    lines.push(
      `  --against: crps ${money(dm.crpsAgainst)}, this forecast's ${money(dm.crpsForecast)}, on ${dm.days} common days: ${which}; ` +
        ('hln' in dm ? `Diebold-Mariano (HLN) ${formatNumber(dm.hln, 3)}, one-sided p = ${p(oneSided as number)} that it is, two-sided ${p(dm.pValueTwoSided)}` : `Diebold-Mariano not defined: ${dm.reason}`),
    );
  }
  const paths = summary.paths;
  if (paths !== null) {
    lines.push(
      `  paths (${paths.days} days): energy score ${money(paths.energyScore)} (${money(paths.periodsIndependent.energyScore)} with the periods independent), ` +
        `variogram score ${formatNumber(paths.variogramScore, 4)} (${formatNumber(paths.periodsIndependent.variogramScore, 4)})`,
    );
  }
  lines.push(`  wrote ${out}/${written.join(', ')}`);
  return `${lines.join('\n')}\n`;
}
