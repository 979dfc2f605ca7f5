/**
 * Starts a worker thread from a TypeScript module of the API, as the analysis and the what-if
 * run theirs: the engine's work never blocks the API's event loop.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';

const tsconfigPath = fileURLToPath(new URL('../../../../tsconfig.json', import.meta.url));
const tsxApi =
  typeof import.meta.resolve === 'function' ? import.meta.resolve('tsx/esm/api') : 'tsx/esm/api';

/**
 * A worker running `moduleUrl` (a `.ts` file) with `workerData`. The entry registers tsx's
 * loader, then imports the module: Node 20 ignores `--import` in a Worker's `execArgv` (checked
 * on 20.20: a preload given there never runs), so `execArgv: ['--import', 'tsx']` alone fails
 * with "Unknown file extension .ts"; registering through tsx's API inside the thread works on
 * Node 20 and later alike.
 */
export function startTsWorker(moduleUrl: URL, workerData: unknown): Worker {
  const bootstrap =
    `import(${JSON.stringify(tsxApi)})` +
    `.then((tsx) => { tsx.register(); return import(${JSON.stringify(moduleUrl.href)}); })`;
  return new Worker(bootstrap, {
    eval: true,
    workerData,
    // tsx resolves the @keelson/* aliases from this tsconfig whatever the working directory.
    env: existsSync(tsconfigPath)
      ? { ...process.env, TSX_TSCONFIG_PATH: tsconfigPath }
      : process.env,
  });
}
