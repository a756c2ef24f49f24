// Seeded fictional inputs for the 10-year scale run (bench/scale10y.sh): a quarter-hour market on the
// Europe/Berlin clock, price history 2017-01-01 to 2026-12-31 (350,592 delivery periods, clock-change
// days included) with imbalance prices, and a 19-level quantile forecast (0.05 to 0.95) for the same
// periods. Nothing here is real data: the numbers come from the seeded generator below, to exercise
// size and memory, not to be realistic.
//
//   node bench/scale10yData.js DIR     writes DIR/market.json, battery.json, history.csv, quantiles.csv, scenario.json
//
// Model, per delivery period t of day d (local hour h):
//   expected price  m_t = 70 + 25 cos(2 pi (doy - 15) / 365.25)           (season, winter higher)
//                        + 30 bump(h, 8.5) + 45 bump(h, 19) - 35 bump(h, 13) x summer   (peaks, solar dip)
//                        + D_d, with D_d an AR(1) over days (phi 0.7, sd 15)
//   price           p_t = m_t + e_t, e_t an AR(1) over periods (phi 0.9, sd 18), plus rare spikes,
//                        clamped into [floor, cap]
//   imbalance price  p_t + 0.5 (p_t - m_t) + N(0, 5)
//   forecast        median m_t + N(0, 6); level tau at median + s_t z_tau with s_t = 14 + 0.12 |m_t|,
//                   z_tau the standard normal quantile, clamped into [floor, cap]
// Random numbers: xorshift32 (Marsaglia 2003, "Xorshift RNGs", J. Stat. Software 8(14)), normal
// deviates by Box-Muller (Box and Muller 1958), normal quantiles by Acklam's rational approximation
// (relative error < 1.2e-9; from memory, ample for synthetic data).
import { closeSync, mkdirSync, openSync, writeFileSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { DateTime } from 'luxon';

const SEED = 20170101;
const ZONE = 'Europe/Berlin';
const FIRST_DAY = '2017-01-01';
const LAST_DAY = '2026-12-31';
const PERIOD_MS = 15 * 60_000;
const PRICE_FLOOR = -500;
const PRICE_CAP = 4000;
const LEVELS = Array.from({ length: 19 }, (_, i) => (i + 1) / 20);

const dir = process.argv[2];
if (dir === undefined) {
  process.stderr.write('usage: node bench/scale10yData.js DIR\n');
  process.exit(2);
}

let state = SEED >>> 0 || 1;
function uniform() {
  state ^= state << 13;
  state >>>= 0;
  state ^= state >>> 17;
  state ^= state << 5;
  state >>>= 0;
  return (state + 0.5) / 4294967296;
}
function normal() {
  return Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** Standard normal quantile, Acklam's algorithm. */
function normalQuantile(p) {
  const a = [-39.69683028665376, 220.9460984245205, -275.9285104469687, 138.357751867269, -30.66479806614716, 2.506628274631];
  const b = [-54.47609879822406, 161.5858368580409, -155.6989798598866, 66.80131188771972, -13.28068155288572];
  const c = [-0.007784894002430293, -0.3223964580411365, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
  const d = [0.007784695709041462, 0.3224671290700398, 2.445134137142996, 3.754408661907416];
  const tail = (q) => (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  if (p < 0.02425) return tail(Math.sqrt(-2 * Math.log(p)));
  if (p > 1 - 0.02425) return -tail(Math.sqrt(-2 * Math.log(1 - p)));
  const q = p - 0.5;
  const r = q * q;
  return ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
}

const bump = (h, mu) => Math.exp(-0.5 * ((h - mu) / 1.6) ** 2);
const clamp = (x) => Math.min(PRICE_CAP, Math.max(PRICE_FLOOR, x));
const fixed = (x) => (Math.round(x * 100) / 100).toFixed(2);

/** Appends lines to a file through a 1 MiB buffer, so the 60 MB of text is never held at once. */
function lineWriter(path) {
  const fd = openSync(path, 'w');
  let chunk = [];
  let size = 0;
  const flush = () => {
    writeSync(fd, chunk.join(''));
    chunk = [];
    size = 0;
  };
  return {
    line(text) {
      chunk.push(text, '\n');
      size += text.length + 1;
      if (size > 1 << 20) flush();
    },
    close() {
      flush();
      closeSync(fd);
    },
  };
}

mkdirSync(dir, { recursive: true });
const json = (value) => `${JSON.stringify(value, null, 2)}\n`;
writeFileSync(join(dir, 'market.json'), json({ timeZone: ZONE, periodMinutes: 15, priceFloor: PRICE_FLOOR, priceCap: PRICE_CAP, currency: 'HLV', gateClosure: '12:00', imbalance: { kind: 'clearing-plus-penalty', penaltyPerMwh: 15 } }));
writeFileSync(join(dir, 'battery.json'), json({ energyMwh: 10, chargeMw: 5, dischargeMw: 5, roundTripEfficiency: 0.88, socMinFraction: 0.05, socMaxFraction: 0.95, socInitialFraction: 0.5, maxCyclesPerDay: 2, degradationCostPerMwh: 4 }));
writeFileSync(join(dir, 'scenario.json'), json({ name: 'scale run (fictional)', market: 'market.json', battery: 'battery.json', history: 'history.csv', forecast: 'quantiles.csv' }));

const history = lineWriter(join(dir, 'history.csv'));
const quantiles = lineWriter(join(dir, 'quantiles.csv'));
history.line('period_start,price,imbalance_price');
quantiles.line(`period_start,${LEVELS.map((l) => `q${l}`).join(',')}`);
const zs = LEVELS.map(normalQuantile);

const start = DateTime.fromISO(`${FIRST_DAY}T00:00`, { zone: ZONE }).toMillis();
const end = DateTime.fromISO(`${LAST_DAY}T00:00`, { zone: ZONE }).plus({ days: 1 }).toMillis();
let dayShock = 0;
let noise = 0;
let spike = 0;
let day = '';
let periods = 0;
for (let ms = start; ms < end; ms += PERIOD_MS) {
  const at = DateTime.fromMillis(ms, { zone: ZONE });
  const today = at.toISODate();
  if (today !== day) {
    day = today;
    dayShock = 0.7 * dayShock + 15 * Math.sqrt(1 - 0.49) * normal();
    spike = uniform() < 0.01 ? 200 + 800 * uniform() : 0;
  }
  const h = at.hour + at.minute / 60 + 0.125;
  const season = Math.cos((2 * Math.PI * (at.ordinal - 15)) / 365.25);
  const expected = 70 + 25 * season + 30 * bump(h, 8.5) + 45 * bump(h, 19) - 35 * bump(h, 13) * (1 - season) / 2 + dayShock;
  noise = 0.9 * noise + 18 * Math.sqrt(1 - 0.81) * normal();
  const price = clamp(expected + noise + (h > 17 && h < 20 ? spike : 0));
  const imbalance = clamp(price + 0.5 * (price - expected) + 5 * normal());
  const median = expected + 6 * normal();
  const spread = 14 + 0.12 * Math.abs(median);
  const iso = at.toISO({ suppressMilliseconds: true });
  history.line(`${iso},${fixed(price)},${fixed(imbalance)}`);
  quantiles.line(`${iso},${zs.map((z) => fixed(clamp(median + spread * z))).join(',')}`);
  periods++;
}
history.close();
quantiles.close();
process.stdout.write(`${periods} delivery periods, ${FIRST_DAY} to ${LAST_DAY}, ${LEVELS.length} levels, in ${dir}\n`);
