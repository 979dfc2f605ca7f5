/** Maps register rows to the DTOs of `@keelson/contracts`. */
import type {
  LikelihoodOverrideDto,
  RegisterEntryDetailDto,
  RegisterEntryDto,
} from '@keelson/contracts';
import type { LikelihoodOverrideRecord, RegisterEntryRecord } from './register.repository';

/** An entry as listed. */
export function toRegisterEntryDto(
  record: RegisterEntryRecord,
  plants: readonly string[],
): RegisterEntryDto {
  return {
    id: record.id,
    title: record.title,
    supplierCode: record.supplierCode,
    supplierName: record.supplierName,
    plants: [...plants],
    origin: record.origin,
    status: record.status,
    owner: record.ownerId === null || record.ownerName === null
      ? null
      : { id: record.ownerId, name: record.ownerName },
    runId: record.runId,
    computedLikelihood: record.computedLikelihood,
    likelihoodOverride: record.likelihoodOverride,
    likelihood: record.likelihoodOverride ?? record.computedLikelihood,
    impactBand: record.impactBand,
    rating: record.rating,
    ratingBand: record.ratingBand,
    notes: record.notes,
    flag: record.flag,
    createdAt: record.createdAt,
    updatedAt: record.updatedAt,
  };
}

/** One row of the override history. */
export function toLikelihoodOverrideDto(record: LikelihoodOverrideRecord): LikelihoodOverrideDto {
  return {
    id: record.id,
    likelihood: record.likelihood,
    previous: record.previous,
    reason: record.reason,
    user: record.userId === null || record.userName === null
      ? null
      : { id: record.userId, name: record.userName },
    createdAt: record.createdAt,
  };
}

/** An entry with its override history. */
export function toRegisterEntryDetailDto(
  record: RegisterEntryRecord,
  plants: readonly string[],
  overrides: readonly LikelihoodOverrideRecord[],
): RegisterEntryDetailDto {
  return {
    ...toRegisterEntryDto(record, plants),
    overrides: overrides.map(toLikelihoodOverrideDto),
  };
}
