import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { concaveStep, maxOf, Pwl, PwlScratch } from '../../../src/plan/warehouse/pwl.js';

// The piecewise-linear operations of the day solver's dynamic program, checked against their
// definitions evaluated by enumeration (fast-check, fixed seeds):
// - concaveStep against G(s) = max_w F(s - w) + k(w) restricted to [lo, hi]. Over w the sum is
//   piecewise linear, so its maximum lies at a kernel breakpoint or where s - w meets a breakpoint
//   of F (a linear function on an interval attains its maximum at an end; Rockafellar 1970,
//   Convex Analysis, section 32). Nothing of the slope merge the code uses enters the check.
// - maxOf against the pointwise maximum (where that maximum is continuous, as in the solver).

const EPS = 1e-12;

/** A concave piecewise-linear function: sorted x, slopes drawn in decreasing order. */
const concaveArb = fc
  .record({
    x0: fc.integer({ min: -50, max: 50 }),
    widths: fc.array(fc.integer({ min: 1, max: 20 }), { minLength: 0, maxLength: 6 }),
    slopes: fc.array(fc.integer({ min: -100, max: 100 }), { minLength: 6, maxLength: 6 }),
    v0: fc.integer({ min: -500, max: 500 }),
  })
  .map(({ x0, widths, slopes, v0 }) => {
    const down = [...slopes].sort((a, b) => b - a);
    const points: [number, number][] = [[x0, v0]];
    widths.forEach((w, i) => {
      const [x, v] = points[points.length - 1]!;
      points.push([x + w, v + down[i]! * w]);
    });
    return points;
  });

/** Any piecewise-linear function (not necessarily concave). */
const generalArb = fc
  .record({
    x0: fc.integer({ min: -50, max: 50 }),
    widths: fc.array(fc.integer({ min: 1, max: 20 }), { minLength: 0, maxLength: 6 }),
    values: fc.array(fc.integer({ min: -500, max: 500 }), { minLength: 7, maxLength: 7 }),
  })
  .map(({ x0, widths, values }) => {
    const points: [number, number][] = [[x0, values[0]!]];
    widths.forEach((w, i) => points.push([points[points.length - 1]![0] + w, values[i + 1]!]));
    return points;
  });

function pwlOf(points: readonly [number, number][]): Pwl {
  const f = new Pwl(4);
  for (const [x, v] of points) f.push(x, v);
  return f;
}

/** F(x) by its definition (linear between breakpoints), -Infinity outside the domain. */
function evaluate(points: readonly [number, number][], x: number): number {
  const first = points[0]!;
  const last = points[points.length - 1]!;
  if (x < first[0] - EPS || x > last[0] + EPS) return -Infinity;
  if (points.length === 1) return first[1];
  for (let i = 0; i + 1 < points.length; i++) {
    const [x0, v0] = points[i]!;
    const [x1, v1] = points[i + 1]!;
    if (x <= x1 + EPS) return v0 + ((v1 - v0) * (Math.min(Math.max(x, x0), x1) - x0)) / (x1 - x0);
  }
  return last[1];
}

function pointsOf(f: Pwl): [number, number][] {
  return Array.from({ length: f.n }, (_, i) => [f.xs[i]!, f.vs[i]!] as [number, number]);
}

describe('concaveStep', () => {
  it('equals the sup-convolution with a two-piece concave kernel, restricted to the window', () => {
    const kernelArb = fc.record({
      a: fc.integer({ min: -20, max: 0 }),
      len1: fc.integer({ min: 0, max: 15 }),
      len2: fc.integer({ min: 0, max: 15 }),
      s1: fc.integer({ min: -60, max: 60 }),
      drop: fc.integer({ min: 0, max: 60 }),
      lo: fc.integer({ min: -80, max: 40 }),
      width: fc.integer({ min: 0, max: 120 }),
    });
    fc.assert(
      fc.property(concaveArb, kernelArb, (points, k) => {
        const s2 = k.s1 - k.drop;
        const hi = k.lo + k.width;
        const kernel = (w: number): number => (w <= k.a + k.len1 ? k.s1 * w : k.s1 * (k.a + k.len1) + s2 * (w - k.a - k.len1));
        const out = new Pwl(4);
        const kernel2 = { lower: { from: k.a, to: k.a + k.len1, slope: k.s1 }, upper: { from: k.a + k.len1, to: k.a + k.len1 + k.len2, slope: s2 } };
        const met = concaveStep(pwlOf(points), kernel2, { lo: k.lo, hi, eps: 0 }, new PwlScratch(), out);
        const domainLo = points[0]![0] + k.a;
        const domainHi = points[points.length - 1]![0] + k.a + k.len1 + k.len2;
        expect(met).toBe(!(domainLo > hi || domainHi < k.lo));
        if (!met) return;
        const from = Math.max(domainLo, k.lo);
        const to = Math.min(domainHi, hi);
        const result = pointsOf(out);
        expect(result[0]![0]).toBeCloseTo(from, 9);
        expect(result[result.length - 1]![0]).toBeCloseTo(to, 9);
        for (let step = 0; step <= 40; step++) {
          const s = from + ((to - from) * step) / 40;
          // Candidates for the maximising w: kernel ends and kink, and s - x_i for F's breakpoints.
          const candidates = [k.a, k.a + k.len1, k.a + k.len1 + k.len2, ...points.map(([x]) => s - x)];
          let best = -Infinity;
          for (const w of candidates) {
            if (w < k.a - EPS || w > k.a + k.len1 + k.len2 + EPS) continue;
            best = Math.max(best, evaluate(points, s - w) + kernel(w));
          }
          expect(evaluate(result, s)).toBeCloseTo(best, 6);
        }
      }),
      { seed: 20261202, numRuns: 400 },
    );
  });
});

describe('maxOf', () => {
  it('equals the pointwise maximum on the union of the domains', () => {
    fc.assert(
      fc.property(generalArb, generalArb, (pf, pg) => {
        const f = pwlOf(pf);
        const g = pwlOf(pg);
        const lo = Math.min(pf[0]![0], pg[0]![0]);
        const hi = Math.max(pf[pf.length - 1]![0], pg[pg.length - 1]![0]);
        // maxOf needs overlapping domains, and a continuous maximum: at each end of the overlap the
        // function that goes on beyond it is the larger one. The day solver's pair always is: the
        // charge side starts where it equals F and the discharge side ends where it equals F.
        const overlapLo = Math.max(pf[0]![0], pg[0]![0]);
        const overlapHi = Math.min(pf[pf.length - 1]![0], pg[pg.length - 1]![0]);
        fc.pre(overlapLo <= overlapHi);
        const [leftOuter, leftInner] = pf[0]![0] < pg[0]![0] ? [pf, pg] : [pg, pf];
        const [rightOuter, rightInner] = pf[pf.length - 1]![0] > pg[pg.length - 1]![0] ? [pf, pg] : [pg, pf];
        fc.pre(pf[0]![0] === pg[0]![0] || evaluate(leftOuter, overlapLo) >= evaluate(leftInner, overlapLo));
        fc.pre(pf[pf.length - 1]![0] === pg[pg.length - 1]![0] || evaluate(rightOuter, overlapHi) >= evaluate(rightInner, overlapHi));
        const out = new Pwl(4);
        maxOf(f, g, out);
        const result = pointsOf(out);
        for (let step = 0; step <= 60; step++) {
          const x = lo + ((hi - lo) * step) / 60;
          expect(evaluate(result, x)).toBeCloseTo(Math.max(evaluate(pf, x), evaluate(pg, x)), 6);
        }
      }),
      { seed: 20261202, numRuns: 400 },
    );
  });
});
