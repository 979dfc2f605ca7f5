/**
 * Entry point: `node --import tsx apps/api/src/main.ts`. Reads the config from the environment,
 * starts the server and stops it cleanly on SIGINT or SIGTERM.
 */
import { ConfigError } from './config/app-config';
import { startServer } from './server';

async function main(): Promise<void> {
  const server = await startServer();
  let isStopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (isStopping) return;
    isStopping = true;
    server.logger.info({ signal }, 'stopping');
    // A hung connection must not keep the process alive forever.
    setTimeout(() => process.exit(1), 10_000).unref();
    server.stop().then(
      () => process.exit(0),
      (error: unknown) => {
        server.logger.error({ err: error }, 'stop failed');
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((error: unknown) => {
  if (error instanceof ConfigError) {
    console.error(error.message);
  } else {
    console.error('Keelson could not start:', error);
  }
  process.exit(1);
});
