/**
 * Worker thread of the grid's pool (workerPool.ts): loads the task module and its context once, then
 * runs one setting per message and posts the row, or the error, back.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { loadTask } from './taskModule.js';
import { serialiseError } from './taskError.js';
import type { ResultMessage, RunMessage, WorkerInit } from './workerPool.js';

const init = workerData as WorkerInit;
const port = parentPort;
if (port === null) throw new Error('poolWorker.js runs only as a worker thread');
const task = loadTask(init.taskModuleUrl, init.contextInput);
// A failed load is reported with the first setting, not as an unhandled rejection.
task.catch(() => undefined);

port.on('message', (message: RunMessage) => {
  task
    .then((loaded) => loaded.run(message.setting))
    .then(
      (row): ResultMessage => ({ type: 'done', id: message.id, row }),
      (err: unknown): ResultMessage => ({ type: 'failed', id: message.id, error: serialiseError(err) }),
    )
    .then((result) => port.postMessage(result));
});
