import type { Logger } from 'pino';
import type { KeelsonDatabase } from '@keelson/db';
import type { AppConfig } from './config/app-config';
import type { NetworkGraphCache } from './network/network-graph-cache';
import type { PlantsRepository } from './plants/plants.repository';

/** What a feature module (imports, network, ...) receives to build its routers. */
export interface FeatureDeps {
  config: AppConfig;
  db: KeelsonDatabase;
  logger: Logger;
  now: () => Date;
  /** The organisation's plants and their managers (plant scoping). */
  plants: PlantsRepository;
  /** Built supply graphs of recent network versions, shared by every feature. */
  graphs: NetworkGraphCache;
}
