// The settings of the known-distribution bench (bench/knownMarkets/process.js describes the process).
// Six invented markets that differ the way real ones do: a linear or a convex price response to residual
// load, homoscedastic or driver-dependent noise, spikes up (scarcity at high residual load, or outages at
// any hour) and down (surplus renewables), a persistent day-level component of weak to strong
// persistence, volatile days, weekly profiles, 15/30/60-minute periods in zones with clock changes in
// both hemispheres. The zones are only clocks; the currency label is invented.
//
// Units: loads and capacities [MW]; residual-load parameters [GW]; prices [currency/MWh].
import { readFileSync } from 'node:fs';

const NO_SPIKES = Object.freeze({ rhoHour: 0.9, up: { p0: 0, p1: 0, centreGw: 0, widthGw: 1, low: 0, shape: 1 }, down: { p0: 0, shareCentre: 0, shareWidth: 1, low: 0, high: 0 } });

const LOAD = Object.freeze({ morningPeak: 0.06, eveningPeak: 0.08, winterEvening: 0.04, summerAfternoon: 0, saturday: 0.92, sunday: 0.86, weatherSd: 0.03, weatherPhi: 0.8 });

const PROFILE = Object.freeze({ base: 20, morning: 6, evening: 10, middayDip: 3, weekendPeaks: 0.6, saturday: -3, sunday: -6 });

/** @type {readonly object[]} */
export const SETTINGS = Object.freeze([
  {
    name: 'linear-flat',
    summary: 'linear in residual load, homoscedastic, no spikes, moderate persistence; 60 min, America/Chicago',
    hemisphere: 1,
    latitude: 42,
    longitude: -88,
    market: { timeZone: 'America/Chicago', periodMinutes: 60, floor: -500, cap: 3000 },
    load: { ...LOAD, meanMw: 9000, seasonAmplitude: 0.04, summerAfternoon: 0.12 },
    wind: { capacityMw: 3000, bias: -0.8, season: 0.3, scale: 1.4, phiHour: 0.985 },
    solar: { capacityMw: 1500, clearnessBias: 0.3, clearnessSeason: 0.5 },
    price: { beta: 10, y0: 2, gamma: 0, knee: 0, profile: { ...PROFILE, base: 15 } },
    noise: { sdDay: 0.5, phi: 0.8, clipGw: 3, sd0: 0.4, sdRenewables: 0, sdPeak: 0, rhoHour: 0.8 },
    spikes: NO_SPIKES,
    imbalance: { kappa: 0.5, sd: 3 },
  },
  {
    name: 'convex-hetero',
    summary: 'convex in residual load, noise growing with renewables, scarcity spikes at high residual load, strong persistence; 15 min, Europe/Berlin',
    hemisphere: 1,
    latitude: 51,
    longitude: 10,
    market: { timeZone: 'Europe/Berlin', periodMinutes: 15, floor: -500, cap: 4000 },
    load: { ...LOAD, meanMw: 6000, seasonAmplitude: 0.12 },
    wind: { capacityMw: 4000, bias: -1, season: 0.35, scale: 1.45, phiHour: 0.985 },
    solar: { capacityMw: 3500, clearnessBias: 0.2, clearnessSeason: 0.6 },
    price: { beta: 8, y0: 1, gamma: 5, knee: 4.5, profile: { ...PROFILE, base: 30 } },
    noise: { sdDay: 0.35, phi: 0.9, clipGw: 3, sd0: 0.15, sdRenewables: 0.5, sdPeak: 0.1, rhoHour: 0.85 },
    spikes: { rhoHour: 0.9, up: { p0: 0.0005, p1: 0.03, centreGw: 7.5, widthGw: 0.3, low: 300, shape: 1.5 }, down: NO_SPIKES.down },
    imbalance: { kappa: 0.5, sd: 5 },
  },
  {
    name: 'outage-spikes',
    summary: 'mildly convex, outages at any hour sending prices towards the cap, negative spikes at high solar; 30 min, Australia/Sydney',
    hemisphere: -1,
    latitude: -34,
    longitude: 151,
    market: { timeZone: 'Australia/Sydney', periodMinutes: 30, floor: -1000, cap: 15000 },
    load: { ...LOAD, meanMw: 7000, seasonAmplitude: 0.06, summerAfternoon: 0.1 },
    wind: { capacityMw: 2000, bias: -0.9, season: 0.2, scale: 1.3, phiHour: 0.98 },
    solar: { capacityMw: 3000, clearnessBias: 0.6, clearnessSeason: 0.4 },
    price: { beta: 12, y0: 2, gamma: 1.5, knee: 6, profile: { ...PROFILE, base: 40 } },
    noise: { sdDay: 0.4, phi: 0.85, clipGw: 3, sd0: 0.25, sdRenewables: 0.3, sdPeak: 0.1, rhoHour: 0.8 },
    spikes: { rhoHour: 0.95, up: { p0: 0.012, p1: 0, centreGw: 0, widthGw: 1, low: 1000, shape: 3 }, down: { p0: 0.01, shareCentre: 0.5, shareWidth: 0.08, low: -400, high: -50 } },
    imbalance: { kappa: 0.8, sd: 10 },
  },
  {
    name: 'renewables-negative',
    summary: 'much wind and sun: negative prices and down-spikes at high renewable shares, convex top, noise growing with renewables; 60 min, Europe/London',
    hemisphere: 1,
    latitude: 52,
    longitude: -1,
    market: { timeZone: 'Europe/London', periodMinutes: 60, floor: -500, cap: 3000 },
    load: { ...LOAD, meanMw: 5000, seasonAmplitude: 0.12 },
    wind: { capacityMw: 5000, bias: -0.8, season: 0.4, scale: 1.5, phiHour: 0.985 },
    solar: { capacityMw: 2500, clearnessBias: 0.1, clearnessSeason: 0.7 },
    price: { beta: 9, y0: 0.5, gamma: 3, knee: 4.5, profile: { ...PROFILE, base: 25 } },
    noise: { sdDay: 0.3, phi: 0.85, clipGw: 3, sd0: 0.2, sdRenewables: 0.8, sdPeak: 0, rhoHour: 0.85 },
    spikes: { rhoHour: 0.9, up: { p0: 0, p1: 0.02, centreGw: 5, widthGw: 0.3, low: 200, shape: 1.2 }, down: { p0: 0.08, shareCentre: 0.85, shareWidth: 0.08, low: -250, high: -10 } },
    imbalance: { kappa: 0.5, sd: 4 },
  },
  {
    name: 'weekly-volatile',
    summary: 'strong weekly profile, noise largest at the peaks, volatile days (2.5x spread, not known ahead), weak persistence; 30 min, America/New_York',
    hemisphere: 1,
    latitude: 41,
    longitude: -74,
    market: { timeZone: 'America/New_York', periodMinutes: 30, floor: -300, cap: 5000 },
    load: { ...LOAD, meanMw: 11000, seasonAmplitude: 0.05, summerAfternoon: 0.1, saturday: 0.82, sunday: 0.72 },
    wind: { capacityMw: 2500, bias: -1, season: 0.3, scale: 1.3, phiHour: 0.98 },
    solar: { capacityMw: 2000, clearnessBias: 0.3, clearnessSeason: 0.5 },
    price: { beta: 7, y0: 3, gamma: 2, knee: 9, profile: { ...PROFILE, base: 20, weekendPeaks: 0.3, saturday: -8, sunday: -15 } },
    noise: { sdDay: 0.45, phi: 0.6, clipGw: 3, sd0: 0.3, sdRenewables: 0.2, sdPeak: 0.35, rhoHour: 0.75, volatileProbability: 0.12, volatileFactor: 2.5 },
    spikes: NO_SPIKES,
    imbalance: { kappa: 0.5, sd: 4 },
  },
  {
    name: 'persistent-level',
    summary: 'very persistent day level, convex, rare spikes both ways; 15 min, Europe/Helsinki',
    hemisphere: 1,
    latitude: 61,
    longitude: 25,
    market: { timeZone: 'Europe/Helsinki', periodMinutes: 15, floor: -500, cap: 4000 },
    load: { ...LOAD, meanMw: 8000, seasonAmplitude: 0.2 },
    wind: { capacityMw: 3000, bias: -0.9, season: 0.3, scale: 1.4, phiHour: 0.985 },
    solar: { capacityMw: 800, clearnessBias: 0, clearnessSeason: 0.6 },
    price: { beta: 6, y0: 3, gamma: 4, knee: 8.5, profile: { ...PROFILE, base: 30 } },
    noise: { sdDay: 0.3, phi: 0.95, clipGw: 3, sd0: 0.2, sdRenewables: 0.4, sdPeak: 0.05, rhoHour: 0.9 },
    spikes: { rhoHour: 0.9, up: { p0: 0.001, p1: 0.01, centreGw: 10, widthGw: 0.4, low: 400, shape: 2 }, down: { p0: 0.01, shareCentre: 0.45, shareWidth: 0.06, low: -100, high: 0 } },
    imbalance: { kappa: 0.5, sd: 4 },
  },
]);

/** History span (three years) and the year the bench scores (the last one). */
export const SPAN = Object.freeze({ from: '2029-01-01', to: '2031-12-31', truthFrom: '2031-01-01' });

/** The battery every setting is planned with: the demo's own (scenarios/halvorn/battery.json). */
export const BATTERY = Object.freeze(JSON.parse(readFileSync(new URL('../../scenarios/halvorn/battery.json', import.meta.url), 'utf8')));
