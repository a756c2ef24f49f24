/**
 * Worker thread of the grid's pool (workerPool.ts): imports the task module as soon as it starts,
 * builds its context once when the context message comes (a worker may start before its inputs are
 * read), then runs one setting per message and posts the row, or the error, back.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { importTask, withContext, type LoadedTask } from './taskModule.js';
import { serialiseError } from './taskError.js';
import type { ResultMessage, ToWorkerMessage, WorkerInit } from './workerPool.js';

const init = workerData as WorkerInit;
const port = parentPort;
if (port === null) throw new Error('poolWorker.js runs only as a worker thread');
const module = importTask(init.taskModuleUrl);
// A failed import is reported with the first setting, not as an unhandled rejection.
module.catch(() => undefined);
let task: Promise<LoadedTask> = Promise.reject(new Error('the pool sent a setting before the context'));
task.catch(() => undefined);

port.on('message', (message: ToWorkerMessage) => {
  if (message.type === 'context') {
    task = module.then((loaded) => withContext(loaded, message.contextInput));
    task.catch(() => undefined);
    return;
  }
  task
    .then((loaded) => loaded.run(message.setting))
    .then(
      (row): ResultMessage => ({ type: 'done', id: message.id, row }),
      (err: unknown): ResultMessage => ({ type: 'failed', id: message.id, error: serialiseError(err) }),
    )
    .then((result) => port.postMessage(result));
});
