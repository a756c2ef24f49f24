import type { BacktestInputData } from '../io/readBacktestInputs.js';

/**
 * The inputs restricted to the delivery days from..to (YYYY-MM-DD, both included): what a grid
 * command hands its worker threads, already read and checked in the parent, so that no worker reads
 * or parses a file again. A backtest over from..to reads no history or forecast day outside them
 * (runBacktest.ts plans each day from that day's forecast and settles it at that day's prices).
 * Plain data; the grid commands share it with their workers as SharedInputs (io/sharedInputs.ts).
 */
export function inputDataSpan(data: BacktestInputData, from: string, to: string): BacktestInputData {
  const inSpan = (day: string): boolean => day >= from && day <= to;
  const { history, forecast } = data;
  return {
    market: data.market,
    batterySpec: data.batterySpec,
    history: {
      days: history.days.filter((d) => inSpan(d.day)),
      exogenousNames: history.exogenousNames,
      incompleteDays: history.incompleteDays.filter((d) => inSpan(d.day)),
    },
    forecast: {
      ...forecast,
      days: new Map([...forecast.days].filter(([day]) => inSpan(day))),
      incompleteDays: forecast.incompleteDays.filter((d) => inSpan(d.day)),
    },
  };
}
