import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer } from '../../apps/api/src/server';

/** A Keelson server on a free port with a fresh demo database, for one browser test file. */
export interface TestServer {
  url: string;
  /** The server's SQLite file, for a step that sets up what the screens cannot (WAL mode). */
  databasePath: string;
  stop(): Promise<void>;
}

/** Starts the real server (demo mode, seeded) on port 0 in a temporary data folder. */
export async function startTestServer(): Promise<TestServer> {
  const dataDir = mkdtempSync(join(tmpdir(), 'keelson-e2e-data-'));
  const databasePath = join(dataDir, 'keelson.db');
  const server = await startServer({
    env: { KEELSON_MODE: 'demo', JWT_SECRET: 'e2e-only-secret-of-sufficient-length-0123456789' },
    port: 0,
    host: '127.0.0.1',
    databasePath,
    logLevel: 'silent',
  });
  return {
    url: server.url,
    databasePath,
    async stop() {
      await server.stop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
