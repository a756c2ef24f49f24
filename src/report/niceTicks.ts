/**
 * "Nice" axis ticks on the 1-2-5 ladder (cf. Heckbert 1990, "Nice numbers for graph labels",
 * Graphics Gems, Academic Press, pp. 61-63, which rounds to the same ladder).
 *
 * Rule: the step is the smallest number m x 10^k (m in {1, 2, 5}, k an integer) with
 * step >= (max - min) / target; the ticks run from floor(min / step) x step to ceil(max / step) x step,
 * so they always cover [min, max].
 *
 * Example: [0, 97] with target 5: (97 - 0) / 5 = 19.4, so the step is 20 and the ticks are
 * 0, 20, 40, 60, 80, 100. An empty range [v, v] is widened first (see widenDegenerate).
 */
export interface NiceTicks {
  /** First tick, <= the data minimum. */
  readonly min: number;
  /** Last tick, >= the data maximum. */
  readonly max: number;
  /** Distance between ticks, on the 1-2-5 ladder. */
  readonly step: number;
  /** Tick values from min to max, rounded to `decimals`. */
  readonly values: readonly number[];
  /** Decimals a tick label needs to show the step exactly (0 for steps >= 1). */
  readonly decimals: number;
}

const LADDER = [1, 2, 5] as const;
/** Guards floor/ceil against binary rounding (0.3 / 0.1 = 2.9999999999999996). */
const EPS = 1e-9;

/**
 * @param min smallest data value
 * @param max largest data value (>= min)
 * @param target wished number of intervals between ticks (>= 1); the result has at most that many
 *   intervals plus one at each end
 */
export function niceTicks(min: number, max: number, target = 5): NiceTicks {
  if (!finiteRange(min, max)) throw new RangeError(`niceTicks needs finite min <= max with a finite width, got [${min}, ${max}]`);
  const [lo, hi] = widenDegenerate(min, max);
  const step = ladderStepAtLeast((hi - lo) / Math.max(1, target));
  const first = Math.floor(lo / step.value + EPS);
  const last = Math.ceil(hi / step.value - EPS);
  return ticksFrom(first, last - first, step);
}

/**
 * Ticks for a secondary axis that line up with a primary axis of `count` ticks: the smallest ladder
 * step for which `count` ticks starting at floor(min / step) x step reach max. The grid lines of the
 * primary axis then also fall on ticks of the secondary one.
 */
export function alignedTicks(min: number, max: number, count: number): NiceTicks {
  if (!finiteRange(min, max)) throw new RangeError(`alignedTicks needs finite min <= max with a finite width, got [${min}, ${max}]`);
  if (!Number.isInteger(count) || count < 2) throw new RangeError(`alignedTicks needs at least 2 ticks, got ${count}`);
  const [lo, hi] = widenDegenerate(min, max);
  let step = ladderStepAtLeast((hi - lo) / (count - 1));
  for (;;) {
    if (!Number.isFinite(step.value)) throw new RangeError(`alignedTicks found no step for [${min}, ${max}]`);
    const first = Math.floor(lo / step.value + EPS);
    if ((first + count - 1) * step.value >= hi - EPS * step.value) return ticksFrom(first, count - 1, step);
    step = nextLadderStep(step);
  }
}

/**
 * Ticks that start and end exactly on a fixed axis range [min, max]: the smallest ladder step from
 * `niceStep` / 2 up whose multiples include both ends, with at most 1.5 x target intervals and at
 * least 2. Null when no ladder step fits (the caller then keeps the nice ticks inside the range).
 * Example: [-5, 5], target 5: step 2 misses the ends, step 5 gives -5, 0, 5.
 */
export function ticksOnFixedEnds(min: number, max: number, niceStep: number, target: number): NiceTicks | null {
  if (!(max > min) || !finiteRange(min, max)) return null;
  const isMultiple = (v: number, s: number) => Math.abs(v / s - Math.round(v / s)) < 1e-9;
  for (let step = ladderStepAtLeast(niceStep / 2); step.value <= (max - min) / 2 + EPS; step = nextLadderStep(step)) {
    const intervals = Math.round((max - min) / step.value);
    if (isMultiple(min, step.value) && isMultiple(max, step.value) && intervals <= 1.5 * target) return ticksFrom(Math.round(min / step.value), intervals, step);
  }
  return null;
}

interface LadderStep {
  readonly value: number;
  readonly decimals: number;
  readonly rung: number;
  readonly exponent: number;
}

function ladderStep(rung: number, exponent: number): LadderStep {
  const m = LADDER[rung] as number;
  // m / 10^k is exact for the ladder's decimals (0.1, 0.2, 0.05 ...); m * 10^-k is not always.
  const value = exponent >= 0 ? m * 10 ** exponent : m / 10 ** -exponent;
  return { value, decimals: Math.max(0, -exponent), rung, exponent };
}

function nextLadderStep(step: LadderStep): LadderStep {
  return step.rung + 1 < LADDER.length ? ladderStep(step.rung + 1, step.exponent) : ladderStep(0, step.exponent + 1);
}

/** Whether [min, max] is a range the ladder can cover: both ends and the width finite, min <= max. */
function finiteRange(min: number, max: number): boolean {
  return Number.isFinite(min) && Number.isFinite(max) && max >= min && Number.isFinite(max - min);
}

function ladderStepAtLeast(raw: number): LadderStep {
  let step = ladderStep(0, Math.floor(Math.log10(raw)) - 1);
  while (step.value < raw * (1 - EPS)) step = nextLadderStep(step);
  return step;
}

function ticksFrom(first: number, intervals: number, step: LadderStep): NiceTicks {
  const values: number[] = [];
  for (let i = 0; i <= intervals; i++) values.push(roundTo((first + i) * step.value, step.decimals));
  return { min: values[0] as number, max: values[values.length - 1] as number, step: step.value, values, decimals: step.decimals };
}

/**
 * An empty range [v, v] becomes [v - 1, v + 1] for v = 0, else v -/+ |v| / 10. A range narrower than
 * 1e-12, or than 1e-9 of its magnitude, counts as empty: no axis shows such a difference.
 */
function widenDegenerate(min: number, max: number): [number, number] {
  if (max - min >= 1e-12 && max - min > 1e-9 * Math.max(Math.abs(min), Math.abs(max))) return [min, max];
  const mid = (min + max) / 2;
  const half = Math.abs(mid) < 1e-12 ? 1 : Math.abs(mid) / 10;
  return [mid - half, mid + half];
}

function roundTo(value: number, decimals: number): number {
  const rounded = Number(value.toFixed(decimals));
  return Object.is(rounded, -0) ? 0 : rounded;
}
