import type { Express } from 'express';
import { CountriesRepository } from '../countries/countries.repository';
import { createCountriesRouter } from '../countries/countries.router';
import { CountriesService } from '../countries/countries.service';
import type { FeatureDeps } from '../feature-deps';
import { NetworkCatalogRepository } from './network-catalog.repository';
import { NetworkCatalogService } from './network-catalog.service';
import { NetworkSuppliersRepository } from './network-suppliers.repository';
import { NetworkSuppliersService } from './network-suppliers.service';
import { createNetworkVersionsRouter } from './network-versions.router';
import { NetworkVersionsRepository } from './network-versions.repository';
import { NetworkVersionsService } from './network-versions.service';

/**
 * Mounts `/api/network-versions` (browsing committed networks) and `/api/countries` (the
 * hazard table), and seeds the country table with its invented placeholder ratings when it is
 * empty. The seed is a synchronous insert, so the table is filled before the app answers.
 */
export function mountNetworkRoutes(app: Express, deps: FeatureDeps): void {
  const versionsRepository = new NetworkVersionsRepository(deps.db);
  const suppliersRepository = new NetworkSuppliersRepository(deps.db);
  const catalogRepository = new NetworkCatalogRepository(deps.db);
  const versions = new NetworkVersionsService(versionsRepository, deps.db);
  const suppliers = new NetworkSuppliersService(suppliersRepository, versionsRepository);
  const catalog = new NetworkCatalogService({
    catalog: catalogRepository,
    suppliers: suppliersRepository,
    versions: versionsRepository,
  });
  const countries = new CountriesService(new CountriesRepository(deps.db), deps.now);
  const seeded = countries.seedDefaults();
  if (seeded > 0) {
    deps.logger.info({ countries: seeded }, 'seeded the country table with placeholder hazards');
  }
  app.use('/api/network-versions', createNetworkVersionsRouter({ versions, suppliers, catalog }));
  app.use('/api/countries', createCountriesRouter(countries));
}
