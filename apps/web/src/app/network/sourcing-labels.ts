/**
 * Plain words for the sourcing terms the network pages show: tiers and qualified sources.
 */

/** What the tiers mean, shown beside a supplier's tier. */
export const TIER_MEANING =
  'Tier 1 sells to one of your plants; tier 2 sells to a tier-1 supplier; tier 3 to a tier-2 ' +
  'supplier, and so on up the chain.';

/** What a supplier's tier means for it in particular. */
export function tierExplanation(tier: number | null): string {
  if (tier === null) {
    return 'No tier: none of its sales lead to one of your plants.';
  }
  if (tier === 1) {
    return 'Tier 1: it sells directly to one of your plants.';
  }
  return `Tier ${tier}: it sells to a tier-${tier - 1} supplier, ${tier} steps from a plant.`;
}

/**
 * The warning for an (item, buyer) with too few qualified sources, or null when there are two
 * or more: one source is a single point of failure; none means nobody is qualified yet.
 */
export function sourcesFlag(qualifiedSources: number | null): string | null {
  if (qualifiedSources === null || qualifiedSources >= 2) {
    return null;
  }
  return qualifiedSources === 1 ? 'Single source' : 'No qualified source';
}
