/**
 * The risk register's domain: listing within a user's plants, manual entries scored from the
 * latest run (or from the supplier's data when no run has it), edits, likelihood overrides with
 * their history, and re-scoring every entry when the scoring settings change.
 */
import type {
  CreateRegisterEntryInput,
  ExportRegisterQuery,
  ListRegisterQuery,
  OverrideLikelihoodInput,
  RegisterEntryDetailDto,
  RegisterEntryDto,
  RegisterListDto,
  RegisterOwnersDto,
  UpdateRegisterEntryInput,
} from '@keelson/contracts';
import type { KeelsonDatabase, NetworkSupplierRow } from '@keelson/db';
import { likelihoodOf, registerScore, type ScoringSettings } from '@keelson/scoring';
import { recordAudit } from '../audit/audit-trail';
import { CountriesRepository } from '../countries/countries.repository';
import { invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { latestNetworkVersionId } from '../network/network-store';
import {
  checkPlantFilter,
  effectivePlants,
  plantScopeOf,
  type PlantScope,
} from '../network/plant-scope';
import { loadScoringSettings } from '../settings/scoring-settings.repository';
import { toRegisterEntryDetailDto, toRegisterEntryDto } from './register-entry-dto';
import type { RegisterRepository } from './register.repository';

/** What the register service is built from. */
export interface RegisterServiceDeps {
  repository: RegisterRepository;
  db: KeelsonDatabase;
  now: () => Date;
}

/** An entry for the export: the listed fields and its latest override, if any. */
export interface RegisterExportRow extends RegisterEntryDto {
  latestOverride: { reason: string; userName: string | null; createdAt: string } | null;
}

/** The risk register. */
export class RegisterService {
  constructor(private readonly deps: RegisterServiceDeps) {}

  /** A page of the entries the user may see. */
  list(user: SessionUser, query: ListRegisterQuery): RegisterListDto {
    const { limit, offset, ...filters } = query;
    const { rows, total, plants } = this.select(user, filters, { limit, offset });
    return { items: rows.map((row) => toRegisterEntryDto(row, plants.get(row.id) ?? [])), total };
  }

  /** Every entry the user may see that matches the filters, with its latest override. */
  exportRows(user: SessionUser, query: ExportRegisterQuery): RegisterExportRow[] {
    const { rows, plants } = this.select(user, query);
    const latest = new Map<number, RegisterExportRow['latestOverride']>();
    // Oldest first, so the last one written per entry is its latest.
    for (const override of this.deps.repository.overridesOf(rows.map((row) => row.id))) {
      latest.set(override.entryId, { reason: override.reason, userName: override.userName,
        createdAt: override.createdAt });
    }
    return rows.map((row) => ({ ...toRegisterEntryDto(row, plants.get(row.id) ?? []),
      latestOverride: latest.get(row.id) ?? null }));
  }

  /** One entry with its override history; 404 when it is outside a plant manager's plants. */
  detail(user: SessionUser, id: number): RegisterEntryDetailDto {
    const { repository } = this.deps;
    const record = repository.find(latestNetworkVersionId(this.deps.db), id);
    const plants = repository.plantsOf([id]).get(id) ?? [];
    const scope = plantScopeOf(user);
    if (!record || (scope !== null && !plants.some((plant) => scope.includes(plant)))) {
      throw notFound(`Register entry ${id} was not found.`);
    }
    return toRegisterEntryDetailDto(record, plants, repository.overridesOf([id]));
  }

  /**
   * A manual entry for a supplier of the latest network version. Its scores come from the most
   * recent succeeded run that has the supplier; without one, the likelihood is computed from the
   * supplier's data and the impact band is 1 (no impact has been measured yet).
   */
  create(user: SessionUser, input: CreateRegisterEntryInput): RegisterEntryDetailDto {
    const { repository, db } = this.deps;
    const versionId = latestNetworkVersionId(db);
    const supplier = versionId === null
      ? undefined
      : repository.supplier(versionId, input.supplierCode);
    if (versionId === null || !supplier) {
      const where = versionId === null ? 'no network has been imported yet'
        : `it is not in the latest network version (${versionId})`;
      throw fieldError('body.supplierCode',
        `Supplier ${input.supplierCode} cannot be used: ${where}.`);
    }
    const ownerId = input.ownerId ?? null;
    if (ownerId !== null) this.checkOwner(ownerId);
    const settings = loadScoringSettings(db);
    const scored = this.scoreOf(versionId, supplier, settings);
    const stamp = this.deps.now().toISOString();
    const id = repository.transaction(() => {
      const created = repository.insert({
        supplierCode: supplier.code, title: input.title, origin: 'manual', status: 'open',
        ownerId, runId: scored.runId, computedLikelihood: scored.likelihood,
        impactBand: scored.impactBand, rating: scored.rating, ratingBand: scored.ratingBand,
        notes: input.notes ?? '', createdBy: user.id, createdAt: stamp, updatedAt: stamp,
      }, scored.plants);
      recordAudit(db, { action: 'register.created', subjectType: 'register_entry',
        subjectId: created, userId: user.id, after: { entryId: created,
          supplierCode: supplier.code, title: input.title, ownerId, rating: scored.rating,
          ratingBand: scored.ratingBand } }, new Date(stamp));
      return created;
    });
    return this.detail(user, id);
  }

  /** The users an entry may be given to (active ones), for the owner picker. */
  owners(): RegisterOwnersDto {
    return { items: this.deps.repository.activeUsers() };
  }

  /** Changes the title, owner (an active user), status or notes of an entry. */
  update(user: SessionUser, id: number, input: UpdateRegisterEntryInput): RegisterEntryDetailDto {
    const before = this.detail(user, id);
    if (input.ownerId !== undefined && input.ownerId !== null) this.checkOwner(input.ownerId);
    const changes = {
      ...(input.title === undefined ? {} : { title: input.title }),
      ...(input.ownerId === undefined ? {} : { ownerId: input.ownerId }),
      ...(input.status === undefined ? {} : { status: input.status }),
      ...(input.notes === undefined ? {} : { notes: input.notes }),
    };
    const now = this.deps.now();
    const { repository } = this.deps;
    repository.transaction(() => {
      repository.update(id, { ...changes, updatedAt: now.toISOString() });
      const previous = Object.fromEntries(Object.keys(changes).map((key) =>
        [key, key === 'ownerId' ? (before.owner?.id ?? null) : before[key as keyof typeof before]]));
      recordAudit(this.deps.db, { action: 'register.updated', subjectType: 'register_entry',
        subjectId: id, userId: user.id, before: previous, after: changes }, now);
    });
    return this.detail(user, id);
  }

  /**
   * Sets (1-5) or removes (null) the likelihood override, re-scores the entry with the current
   * settings and appends the change, with who, when and why, to the entry's history.
   */
  overrideLikelihood(
    user: SessionUser,
    id: number,
    input: OverrideLikelihoodInput,
  ): RegisterEntryDetailDto {
    const { repository } = this.deps;
    const entry = this.detail(user, id);
    const settings = loadScoringSettings(this.deps.db);
    const score = registerScore(entry.impactBand, input.likelihood ?? entry.computedLikelihood,
      settings);
    const stamp = this.deps.now().toISOString();
    repository.transaction(() => {
      repository.update(id, { likelihoodOverride: input.likelihood, rating: score.rating,
        ratingBand: score.ratingBand, updatedAt: stamp });
      repository.insertOverride({ entryId: id, likelihood: input.likelihood,
        previous: entry.likelihoodOverride, reason: input.reason, userId: user.id,
        createdAt: stamp });
      recordAudit(this.deps.db, { action: 'register.likelihood_overridden',
        subjectType: 'register_entry', subjectId: id, userId: user.id,
        before: { likelihoodOverride: entry.likelihoodOverride, rating: entry.rating },
        after: { likelihoodOverride: input.likelihood, rating: score.rating,
          reason: input.reason } }, new Date(stamp));
    });
    return this.detail(user, id);
  }

  /**
   * Recomputes every entry's rating and band with `settings` (call it in the transaction that
   * saves them). Impact bands and computed likelihoods stay those of each entry's run until the
   * next run; only the rating bands change with the floors. Returns how many entries changed.
   */
  rescoreAll(settings: ScoringSettings): number {
    const { repository } = this.deps;
    const stamp = this.deps.now().toISOString();
    let changed = 0;
    for (const entry of repository.scoringInputs()) {
      const score = registerScore(entry.impactBand,
        entry.likelihoodOverride ?? entry.computedLikelihood, settings);
      if (score.rating === entry.rating && score.ratingBand === entry.ratingBand) continue;
      repository.update(entry.id, { rating: score.rating, ratingBand: score.ratingBand,
        updatedAt: stamp });
      changed++;
    }
    return changed;
  }

  private select(
    user: SessionUser,
    filters: ExportRegisterQuery,
    page?: { limit: number; offset: number },
  ) {
    const scope: PlantScope = plantScopeOf(user);
    checkPlantFilter(scope, filters.plant);
    const { plant, ...rest } = filters;
    const versionId = latestNetworkVersionId(this.deps.db);
    const { rows, total } = this.deps.repository.list(versionId,
      { ...rest, plants: effectivePlants(scope, plant) }, page);
    return { rows, total, plants: this.deps.repository.plantsOf(rows.map((row) => row.id)) };
  }

  private checkOwner(ownerId: number): void {
    const owner = this.deps.repository.user(ownerId);
    if (!owner || !owner.isActive) {
      throw fieldError('body.ownerId', owner
        ? `User ${ownerId} (${owner.name}) is deactivated and cannot own an entry.`
        : `There is no user ${ownerId}.`);
    }
  }

  private scoreOf(versionId: number, supplier: NetworkSupplierRow, settings: ScoringSettings) {
    const { repository } = this.deps;
    const code = supplier.code;
    const run = repository.latestRunRow(code);
    if (run) {
      const score = registerScore(run.impactBand, run.likelihood, settings);
      return { ...score, runId: run.runId, plants: run.plants };
    }
    const country = new CountriesRepository(this.deps.db).find(supplier.country.toUpperCase());
    const { likelihood } = likelihoodOf({
      financialHealth: supplier.financialHealth,
      deliveryScore: supplier.deliveryScore,
      hasContinuityPlan: supplier.hasContinuityPlan,
      fewestAlternatives: repository.fewestAlternatives(versionId, code),
      countryHazard: country?.hazard ?? null,
    }, settings);
    const score = registerScore(1, likelihood, settings);
    return { ...score, runId: null, plants: this.deps.repository.servedPlants(versionId, code) };
  }
}

function fieldError(path: string, message: string) {
  return invalidRequest(`The request is not valid: ${path}: ${message}`,
    { issues: [{ path, message }] });
}
