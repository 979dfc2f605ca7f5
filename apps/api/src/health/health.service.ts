import type { HealthDto, KeelsonMode } from '@keelson/contracts';
import type { HealthRepository } from './health.repository';

/** Reports whether the server and its database work. */
export class HealthService {
  constructor(
    private readonly health: HealthRepository,
    private readonly version: string,
    private readonly mode: KeelsonMode,
  ) {}

  /** The health report; `status` is `error` when the database does not answer. */
  check(): HealthDto {
    const isDatabaseUp = this.health.ping();
    return {
      status: isDatabaseUp ? 'ok' : 'error',
      db: isDatabaseUp ? 'ok' : 'error',
      version: this.version,
      mode: this.mode,
    };
  }
}
