/** Sizing a battery: scaling the scenario's battery, choosing alpha out of sample, project economics, the best sizes. */
export { alphaSplit, chooseAlpha, type AlphaChoice, type AlphaMode, type AlphaSplit, type DayRange } from './alphaChoice.js';
export { bestSizes, type NeighbourNpv, type PolicyBestSizes, type SizeAxis, type SizePick, type SizeResult } from './bestSizes.js';
export { scaledBatterySpec, specRoundTripEfficiency, type BatterySize } from './scaledBattery.js';
export { SIZE_IRR_SCAN, sizeEconomics, type SizeBacktestTotals, type SizeCosts, type SizeEconomics } from './sizeEconomics.js';
export { SIZE_COLUMNS, SIZE_POLICIES, sizeSettingRow, type SizeGridSetting, type SizePolicy, type SizeRow, type SizeSetting, type SizeStudy } from './sizeSettingRow.js';
