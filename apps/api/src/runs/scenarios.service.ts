/**
 * Scenarios: the impact of a failure set (named suppliers plus every supplier of some
 * countries or regions) on a network version, and saved failure sets to rerun later. A plant
 * manager sees the lost products of their own plants and the sums over those.
 */
import type {
  FailureSet,
  SaveScenarioInput,
  ScenarioDto,
  ScenarioResultDto,
} from '@keelson/contracts';
import { compareCodePoints, impactOf } from '@keelson/supply-graph';
import { conflict, invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { isInScope, plantScopeOf } from '../network/plant-scope';
import type { NetworkGraphCache } from '../network/network-graph-cache';
import { scenarioPaths } from './scenario-paths';
import type { ScenarioRecord, ScenariosRepository } from './scenarios.repository';

/** Everything {@link ScenariosService} is built from. */
export interface ScenariosServiceDeps {
  repository: ScenariosRepository;
  graphs: NetworkGraphCache;
  now: () => Date;
}

const normalise = (value: string) => value.trim().toLowerCase();

/** Evaluates and stores scenarios. */
export class ScenariosService {
  constructor(private readonly deps: ScenariosServiceDeps) {}

  /** The impact of `set` on version `versionId`; 400 naming unknown supplier codes. */
  evaluate(user: SessionUser, versionId: number, set: FailureSet): ScenarioResultDto {
    const { graph, tiers } = this.deps.graphs.get(versionId);
    const unknown = [...new Set(set.suppliers)].filter((code) => !graph.supplierOrdinalOf
      .has(code)).sort(compareCodePoints);
    if (unknown.length > 0) {
      throw invalidRequest(`body.suppliers: network version ${versionId} has no supplier ` +
        `${unknown.join(', ')}.`, { issues: [{ path: 'body.suppliers',
        message: 'unknown supplier codes' }], unknown });
    }
    const countries = new Set(set.countries.map(normalise).filter((c) => c !== ''));
    const regions = new Set(set.regions.map(normalise).filter((r) => r !== ''));
    const codes = [...set.suppliers];
    for (const supplier of graph.supplierRecords) {
      if (countries.has(normalise(supplier.country)) || regions.has(normalise(supplier.region))) {
        codes.push(supplier.code);
      }
    }
    const impact = impactOf(graph, codes);
    const scope = plantScopeOf(user);
    const products = impact.products.filter((p) => isInScope(scope, p.plantCode));
    const productsLost = products.map((p) => p.code);
    let revenueExposedPerWeek = impact.revenueExposedPerWeek;
    let revenueImpact = impact.revenueImpact;
    if (scope !== null) {
      revenueExposedPerWeek = 0;
      revenueImpact = 0;
      for (const product of products) {
        revenueExposedPerWeek += product.weeklyRevenue;
        revenueImpact += product.weeklyRevenue * product.lostWeeks;
      }
    }
    return {
      networkVersionId: versionId,
      failed: impact.failed,
      productsLost,
      revenueExposedPerWeek,
      revenueImpact,
      timeToRecover: impact.timeToRecover,
      products: products.map((p) => ({ ...p })),
      failurePaths: scenarioPaths(graph, tiers, impact.failed, productsLost),
    };
  }

  /** Every saved scenario, by name. */
  list(): ScenarioDto[] {
    return this.deps.repository.list().map(toScenarioDto);
  }

  /** Saves a new scenario; 409 `scenario_name_taken` for a name in use. */
  create(user: SessionUser, input: SaveScenarioInput): ScenarioDto {
    this.checkName(input.name);
    const id = this.deps.repository.insert({ ...valuesOf(input), createdBy: user.id,
      createdAt: this.deps.now().toISOString() });
    return this.get(id);
  }

  /** Replaces a saved scenario; 404 when missing, 409 for a name another one has. */
  update(id: number, input: SaveScenarioInput): ScenarioDto {
    this.get(id);
    this.checkName(input.name, id);
    this.deps.repository.update(id, { ...valuesOf(input),
      updatedAt: this.deps.now().toISOString() });
    return this.get(id);
  }

  /** Deletes a saved scenario; 404 when missing. */
  delete(id: number): void {
    if (!this.deps.repository.delete(id)) throw notFound(`There is no scenario ${id}.`);
  }

  /** One saved scenario; 404 when missing. */
  get(id: number): ScenarioDto {
    const row = this.deps.repository.find(id);
    if (!row) throw notFound(`There is no scenario ${id}.`);
    return toScenarioDto(row);
  }

  private checkName(name: string, exceptId?: number): void {
    const existing = this.deps.repository.findByName(name);
    if (existing && existing.id !== exceptId) {
      throw conflict('scenario_name_taken', `body.name: a scenario called "${name}" exists ` +
        'already; choose another name.', { id: existing.id });
    }
  }
}

function valuesOf(input: SaveScenarioInput) {
  return {
    name: input.name,
    description: input.description ?? null,
    suppliers: [...new Set(input.suppliers)],
    countries: [...new Set(input.countries)],
    regions: [...new Set(input.regions)],
  };
}

function toScenarioDto(row: ScenarioRecord): ScenarioDto {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    suppliers: row.suppliers,
    countries: row.countries,
    regions: row.regions,
    createdBy: row.createdBy === null ? null : { id: row.createdBy, name: row.createdByName ?? '' },
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}
