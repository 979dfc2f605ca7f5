/**
 * The buyer's import feature: builds its services once and mounts `/api/imports` and
 * `/api/import-mappings`. The demo seed and the benchmark build the same services through
 * {@link createImportServices}, so they import exactly as a buyer does.
 */
import type { Express } from 'express';
import type { KeelsonDatabase } from '@keelson/db';
import type { WorkbookLimits } from '@keelson/workbook';
import type { FeatureDeps } from '../feature-deps';
import type { InsertVersion } from './import-commit';
import { createImportMappingsRouter } from './import-mappings.router';
import { ImportMappingsService } from './import-mappings.service';
import { ImportsRepository } from './imports.repository';
import { createImportsRouter } from './imports.router';
import { ImportsService } from './imports.service';

/** Options of {@link createImportServices}. */
export interface ImportServicesOptions {
  now?: () => Date;
  /** Reader limits; set `maxBytes` to the upload limit. */
  limits?: Partial<WorkbookLimits>;
  insertVersion?: InsertVersion;
}

/** The import feature's services. */
export interface ImportServices {
  imports: ImportsService;
  mappings: ImportMappingsService;
}

/** Builds the import services on a database. */
export function createImportServices(
  db: KeelsonDatabase,
  options: ImportServicesOptions = {},
): ImportServices {
  const now = options.now ?? (() => new Date());
  return {
    imports: new ImportsService({ db, now, limits: options.limits,
      insertVersion: options.insertVersion }),
    mappings: new ImportMappingsService({ repository: new ImportsRepository(db), now }),
  };
}

/** Mounts `/api/imports` and `/api/import-mappings`. */
export function mountImportRoutes(app: Express, deps: FeatureDeps): void {
  const uploadMaxBytes = deps.config.uploadMaxBytes;
  const services = createImportServices(deps.db, {
    now: deps.now,
    limits: { maxBytes: uploadMaxBytes },
  });
  app.use('/api/imports', createImportsRouter(services.imports, { uploadMaxBytes }));
  app.use('/api/import-mappings', createImportMappingsRouter(services.mappings));
}
