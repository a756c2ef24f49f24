import { describe, expect, it } from 'vitest';
import { driverSpreadQuantiles, fitSpreadModel, logCosh, SpreadFeatureRows, spreadFeatures } from '../../src/forecast/quantiles/driverSpread.js';
import { PoolOrder } from '../../src/forecast/quantiles/poolOrder.js';

// Invented inputs (formulas shared with test/forecast/driverSpreadReference.py); the check values come from
// that script (NumPy 2.4.6: lstsq for Harvey's (1976) regression of log |e|, np.quantile for definition 7).
const S = 6;
const DAYS = 8;
const LEVELS = [0.1, 0.5, 0.9];
const error = (d: number, s: number) => (((d * 7 + s * 3) % 11) - 5) * (1 + 0.3 * s) + 0.1 * d;
const exog = (d: number, s: number) => 20 + ((d * 5 + s * 2) % 9) * 1.5;
const centre = (d: number, s: number) => 40 + 3 * s - 0.5 * d;
const slots = (f: (s: number) => number) => Float64Array.from({ length: S }, (_, s) => f(s));

const calibration = {
  errors: Array.from({ length: DAYS }, (_, d) => slots((s) => error(d, s))),
  features: Array.from({ length: DAYS }, (_, d) => spreadFeatures([slots((s) => exog(d, s))], slots((s) => centre(d, s)), false)),
};
const targetCentre = slots((s) => 50 + s);
const targetFeatures = spreadFeatures([slots((s) => 26 + s)], targetCentre, false);

// The same errors around centres on an asinh scale, with the log cosh column (the script's second case).
const centreZ = (d: number, s: number) => -2 + 0.7 * s - 0.15 * d;
const calibrationZ = {
  errors: calibration.errors,
  features: Array.from({ length: DAYS }, (_, d) => spreadFeatures([slots((s) => exog(d, s))], slots((s) => centreZ(d, s)), true)),
};
const targetCentreZ = slots((s) => -1.5 + 0.6 * s);
const targetFeaturesZ = spreadFeatures([slots((s) => 26 + s)], targetCentreZ, true);

const REFERENCE = {
  all: [
    [44.399690804041114, 50.4910675551633, 56.41749828641091],
    [44.64240510493196, 51.55747075252426, 58.285286029248994],
    [45.42889514053681, 52.57619254315221, 59.529951061605814],
    [46.732052670626, 53.549609934599516, 60.182557219268716],
    [41.412531468109904, 55.10374216518448, 68.424213897323],
    [41.823444717342454, 56.15539670431014, 70.0992593423719],
  ],
  slot: [
    [46.06125017151404, 51.278334956645146, 55.80511729389003],
    [46.87810115088161, 52.28637946492244, 57.73465404124895],
    [44.58750018657774, 51.67080062775323, 59.127868213798],
    [44.39514280826191, 52.31154004830262, 60.63707456392553],
    [44.368088518021914, 54.14877027593686, 64.09525691831475],
    [45.25175015872349, 54.86104990486756, 70.61512666160888],
  ],
} as const;

/** `python3 test/forecast/driverSpreadReference.py`, "a refit day's regression (first 6 days), prices", pool 'all'. */
const REFERENCE_REFIT = [
  [45.9461338108171, 50.31638547731382, 55.64600079806324],
  [46.52751304016474, 51.349056889283396, 57.2290326730412],
  [46.06912803854218, 52.46287708297328, 60.26019070805866],
  [47.442035264899246, 53.43377340137679, 60.74082613129154],
  [41.12532722182941, 55.00480857090199, 71.93113274787342],
  [39.51701206350816, 56.208375486492926, 76.56384995614675],
] as const;

const REFERENCE_ASINH = {
  all: [
    [-7.742918678646596, -0.9502061231271983, 5.324632253966882],
    [-7.738647149290961, -0.2977422224585331, 6.575870552052046],
    [-7.079540408209389, 0.2970524359374338, 7.111256259863379],
    [-5.447793724331079, 0.8061898060556222, 6.583371682285351],
    [-9.929683657432717, 1.8537355954501629, 12.738790827369229],
    [-9.66554267569301, 2.4833136247721868, 13.705945103564567],
  ],
  slot: [
    [-5.60516476122268, -0.06770854618482569, 4.798532187052825],
    [-5.285779085102584, 0.43568506318750366, 6.38126280860142],
    [-7.892485023202253, -0.6527313506171017, 6.833886919924586],
    [-7.321970721227708, -0.300733534791757, 7.142634516946823],
    [-7.722118474495748, 0.8462984361040986, 9.408074045705085],
    [-6.439907822954915, 0.9405778899597075, 12.91880811101465],
  ],
} as const;

describe('driver spread quantiles (Harvey 1976 spread regression; filtered historical simulation, Barone-Adesi et al. 1999)', () => {
  it.each(['all', 'slot'] as const)('pool %s matches NumPy (driverSpreadReference.py)', (pool) => {
    const got = driverSpreadQuantiles(targetCentre, targetFeatures, calibration, LEVELS, pool);
    got.forEach((row, s) => row.forEach((v, k) => expect(v).toBeCloseTo(REFERENCE[pool][s]![k]!, 8)));
  });

  it.each(['all', 'slot'] as const)('on an asinh scale, with the log cosh column, pool %s matches NumPy (driverSpreadReference.py)', (pool) => {
    const got = driverSpreadQuantiles(targetCentreZ, targetFeaturesZ, calibrationZ, LEVELS, pool);
    got.forEach((row, s) => row.forEach((v, k) => expect(v).toBeCloseTo(REFERENCE_ASINH[pool][s]![k]!, 8)));
  });

  it('follows the asinh transform by the delta method: errors of spread k / cosh Z give quantiles whose distance from the centre times cosh Z is the same in every slot (Oehlert 1992)', () => {
    // |e| = 2 / cosh(centre) exactly, signs alternating: log |e| = log 2 - log cosh(centre), which the
    // regression fits without residual, so every standardised error is +-1 times one constant.
    const zc = (d: number, s: number) => -2.5 + 0.9 * s + 0.05 * d;
    const exact = {
      errors: Array.from({ length: DAYS }, (_, d) => slots((s) => ((d + s) % 2 === 0 ? 2 : -2) / Math.cosh(zc(d, s)))),
      features: Array.from({ length: DAYS }, (_, d) => spreadFeatures([slots((s) => exog(d, s))], slots((s) => zc(d, s)), true)),
    };
    const target = slots((s) => -2.2 + 0.9 * s);
    const got = driverSpreadQuantiles(target, spreadFeatures([slots((s) => exog(3, s))], target, true), exact, [0.1, 0.9], 'all');
    const widths = got.map((row, s) => (row[1]! - target[s]!) * Math.cosh(target[s]!));
    widths.forEach((w) => expect(w).toBeCloseTo(2, 9));
  });

  it('with the spread regression of a refit day (fitted on its own, earlier calibration days) the same as NumPy (script above, "a refit day\'s regression")', () => {
    // The refit day's calibration: the first 6 of the 8 days; the delivery day standardises all 8 by that fit.
    const refit = fitSpreadModel({ errors: calibration.errors.slice(0, 6), features: calibration.features.slice(0, 6) }, S);
    const got = driverSpreadQuantiles(targetCentre, targetFeatures, calibration, LEVELS, 'all', undefined, refit);
    got.forEach((row, s) => row.forEach((v, k) => expect(v).toBeCloseTo(REFERENCE_REFIT[s]![k]!, 8)));
    // Its own fit, given or made inside, is the same numbers bit for bit.
    const own = fitSpreadModel(calibration, S);
    expect(driverSpreadQuantiles(targetCentre, targetFeatures, calibration, LEVELS, 'slot', undefined, own)).toEqual(driverSpreadQuantiles(targetCentre, targetFeatures, calibration, LEVELS, 'slot'));
  });

  it('log cosh is finite and even far out, and equals log(cosh z) where cosh does not overflow', () => {
    for (const z of [0, 0.3, -1.7, 5, -20]) expect(logCosh(z)).toBeCloseTo(Math.log(Math.cosh(z)), 12);
    expect(logCosh(800)).toBeCloseTo(800 - Math.LN2, 9);
    expect(logCosh(-800)).toBe(logCosh(800));
  });

  it('with the pools\' order kept from the day before (poolOrder.ts), the same quantiles bit for bit as sorting afresh', () => {
    const order = new PoolOrder();
    // A window of DAYS - 2 days that moves a day at a time over the calibration days.
    for (const first of [0, 1, 2]) {
      const window = { errors: calibration.errors.slice(first, first + DAYS - 2), features: calibration.features.slice(first, first + DAYS - 2) };
      const dayIds = Int32Array.from({ length: DAYS - 2 }, (_, d) => 100 + first + d);
      const kept = driverSpreadQuantiles(targetCentre, targetFeatures, window, LEVELS, 'slot', { order, dayIds });
      const fresh = driverSpreadQuantiles(targetCentre, targetFeatures, window, LEVELS, 'slot');
      expect(kept.every((row, s) => row.every((v, k) => Object.is(v, fresh[s]![k])))).toBe(true);
    }
  });

  it('SpreadFeatureRows: a day kept from an earlier call gives spreadFeatures of its new centre, bit for bit', () => {
    for (const asinh of [false, true]) {
      const rows = new SpreadFeatureRows();
      const exogenous = [slots((s) => exog(3, s)), slots((s) => 2 * s - 1)];
      for (const shift of [0, 1.5, -2.25]) {
        const centreNow = slots((s) => (asinh ? centreZ(3, s) : centre(3, s)) + shift);
        const got = rows.of(exogenous, centreNow, asinh);
        const want = spreadFeatures(exogenous, centreNow, asinh);
        expect(got.length === want.length && got.every((v, i) => Object.is(v, want[i]))).toBe(true);
      }
    }
    // The time-of-day columns are cos and sin of 2 pi s / S and of twice that angle (6 columns without drivers).
    const first = spreadFeatures([], slots(() => 0), true);
    expect(first[6 * 1 + 0]).toBeCloseTo(Math.cos((2 * Math.PI) / S), 15);
    expect(first[6 * 1 + 3]).toBeCloseTo(Math.sin((4 * Math.PI) / S), 15);
  });

  it('SpreadFeatureRows.fixedSums: features handed out by one object, a regression kept over days whose centres move, the same quantiles bit for bit as without it (every pool)', () => {
    const rows = new SpreadFeatureRows();
    const exogenous = Array.from({ length: DAYS }, (_, d) => [slots((s) => exog(d, s))]);
    const refit = fitSpreadModel(calibrationZ, S);
    for (const pool of ['all', 'slot', 'level'] as const) {
      for (const shift of [0, 0.4, -0.7, 0.4]) {
        const features = exogenous.map((x, d) => rows.of(x, slots((s) => centreZ(d, s) + shift), true));
        const kept = driverSpreadQuantiles(targetCentreZ, targetFeaturesZ, { errors: calibration.errors, features, rows }, LEVELS, pool, undefined, refit);
        const fresh = driverSpreadQuantiles(targetCentreZ, targetFeaturesZ, { errors: calibration.errors, features }, LEVELS, pool, undefined, refit);
        expect(kept.every((row, s) => row.every((v, k) => Object.is(v, fresh[s]![k])))).toBe(true);
      }
    }
  });

  it('scales with the errors: doubling every error doubles the distance of each quantile from the centre (log-linear spread)', () => {
    const doubled = { ...calibration, errors: calibration.errors.map((e) => e.map((v) => 2 * v)) };
    const base = driverSpreadQuantiles(targetCentre, targetFeatures, calibration, LEVELS, 'all');
    const twice = driverSpreadQuantiles(targetCentre, targetFeatures, doubled, LEVELS, 'all');
    twice.forEach((row, s) => row.forEach((v, k) => expect(v - targetCentre[s]!).toBeCloseTo(2 * (base[s]![k]! - targetCentre[s]!), 9)));
  });
});
