import type { RegisterEntryDetailDto, RegisterEntryDto } from '@keelson/contracts';
import { ratingBandOf } from '@keelson/scoring';

/**
 * Register entries for the client's tests, shaped like the API's answers. The suppliers and
 * titles are invented; the shared tier-2 supplier codes follow the demo network's.
 */
export function registerEntry(id: number, overrides: Partial<RegisterEntryDto> = {}):
  RegisterEntryDto {
  const impactBand = overrides.impactBand ?? 4;
  const computedLikelihood = overrides.computedLikelihood ?? 3;
  const likelihoodOverride = overrides.likelihoodOverride ?? null;
  const likelihood = likelihoodOverride ?? computedLikelihood;
  const rating = impactBand * likelihood;
  return {
    id,
    title: `Single source for cast housings (${id})`,
    supplierCode: 'S-2-SHARED-A',
    supplierName: 'Brenna Foundry',
    plants: ['P-NORTH'],
    origin: 'automatic',
    status: 'open',
    owner: { id: 3, name: 'Rania Okafor' },
    runId: 5,
    computedLikelihood,
    likelihoodOverride,
    likelihood,
    impactBand,
    rating,
    ratingBand: ratingBandOf(rating),
    notes: '',
    flag: null,
    createdAt: '2026-11-20T09:00:00.000Z',
    updatedAt: '2026-11-28T16:30:00.000Z',
    ...overrides,
  };
}

/** An entry as GET /api/register/:id answers, with its override history. */
export function registerEntryDetail(
  id: number,
  overrides: Partial<RegisterEntryDetailDto> = {},
): RegisterEntryDetailDto {
  return { ...registerEntry(id, overrides), overrides: [], ...overrides };
}
