import type { Logger } from 'pino';
import type { KeelsonDatabase } from '@keelson/db';
import type { AppConfig } from './config/app-config';
import type { MailOutbox } from './mail/mail-outbox';
import type { Mailer } from './mail/mailer';
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
  /** Sends e-mail (the local sink in demo mode and tests). */
  mailer: Mailer;
  /**
   * Notification e-mails go through here: written before they are sent, tried again when the
   * server refuses them, sent after a restart when the server stopped first.
   */
  outbox: MailOutbox;
  /** Registers a clean-up (a scheduler to stop) that runs when the app closes. */
  onClose: (close: () => void | Promise<void>) => void;
}
