import { isAbsolute, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Setting } from './expandGrid.js';

/** One cell of a result row: a finite number, a plain string, a boolean or null (empty cell). */
export type RowCell = number | string | boolean | null;

/** The result of one setting: column name (lower snake case) -> cell, columns in a fixed order. */
export type GridRow = Readonly<Record<string, RowCell>>;

/**
 * What a task module exports; the contract is spelled out in workerPool.ts. `S` is the type of the
 * grid's settings (SettingOf its axes), `Input` the grid's contextInput, `Context` what loadContext
 * makes of it. A task module declares its exports with these types, e.g.
 * `export function run(setting: SweepSetting, context: SweepTaskContext): SweepRow` (app/sweep/sweepTask.ts).
 */
export interface TaskModule<S extends Setting = Setting, Context = unknown, Input = unknown> {
  run(setting: S, context: Context): GridRow | Promise<GridRow>;
  loadContext?(input: Input): Context | Promise<Context>;
}

/** A task module loaded with its context, ready to run settings. */
export interface LoadedTask {
  run(setting: Setting): Promise<GridRow>;
}

/** A file URL for a task module given as a path (absolute, or relative to the working folder) or URL. */
export function taskModuleUrl(taskModule: string | URL): string {
  if (taskModule instanceof URL) return taskModule.href;
  if (taskModule.startsWith('file:')) return taskModule;
  return pathToFileURL(isAbsolute(taskModule) ? taskModule : resolve(taskModule)).href;
}

/** Imports the task module, checks its exports and builds its context once. */
export async function loadTask(url: string, contextInput: unknown): Promise<LoadedTask> {
  return withContext(await importTask(url), contextInput);
}

/** Imports the task module and checks its exports (a worker does this as it starts, before its context comes). */
export async function importTask(url: string): Promise<TaskModule> {
  const module = (await import(url)) as Partial<TaskModule>;
  if (typeof module.run !== 'function') throw new Error(`task module ${url} does not export a function run(setting, context)`);
  if (module.loadContext !== undefined && typeof module.loadContext !== 'function') {
    throw new Error(`task module ${url} exports loadContext, but not as a function`);
  }
  return module as TaskModule;
}

/** The task ready to run settings: its context built once from `contextInput`. */
export async function withContext(module: TaskModule, contextInput: unknown): Promise<LoadedTask> {
  const run = module.run;
  const context = module.loadContext === undefined ? contextInput : await module.loadContext(contextInput);
  return { run: async (setting) => run(setting, context) };
}
