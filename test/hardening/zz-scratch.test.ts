import { it } from 'vitest';
import { unevenClockShift } from '../../src/market/clockShifts.js';
import { IANAZone } from 'luxon';
it('x', () => {
  const t0 = performance.now();
  const zones = Intl.supportedValuesOf('timeZone');
  const bad: string[] = [];
  for (const z of zones) { const s = unevenClockShift(z, 60); if (s !== null) bad.push(`${z}:${s}`); }
  console.log(zones.length, (performance.now() - t0) / zones.length, bad.join(' '));
  console.log(unevenClockShift('Europe/Berlin', 15), unevenClockShift('Australia/Lord_Howe', 30));
});
