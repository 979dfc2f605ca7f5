/**
 * Plant scoping of the network browser: a plant manager sees only their own plants, the
 * products, items and bill of materials there, and the suppliers whose material reaches them.
 */
import { PLANT_FORBIDDEN } from '@keelson/contracts';
import { AppError } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';

/** The plants a user may see: a list for plant managers, null for everyone else (all plants). */
export type PlantScope = readonly string[] | null;

/** The scope of a signed-in user. */
export function plantScopeOf(user: SessionUser): PlantScope {
  return user.role === 'plant_manager' ? [...user.plantCodes] : null;
}

/** Whether `plantCode` is inside the scope. */
export function isInScope(scope: PlantScope, plantCode: string): boolean {
  return scope === null || scope.includes(plantCode);
}

/**
 * Throws 403 `plant_forbidden` when a plant filter names a plant outside the scope, so a
 * plant manager learns that the plant is not theirs rather than seeing an empty list.
 */
export function checkPlantFilter(scope: PlantScope, plant: string | undefined): void {
  if (plant === undefined || isInScope(scope, plant)) return;
  const own = scope!.length > 0 ? scope!.join(', ') : 'no plants';
  throw new AppError(
    PLANT_FORBIDDEN,
    403,
    `query.plant: plant ${plant} is not one of your plants (you manage ${own}).`,
    { plant, plantCodes: scope },
  );
}

/**
 * The plants to filter on: the plant filter when given (already checked against the scope),
 * otherwise the scope itself (null: no plant condition).
 */
export function effectivePlants(scope: PlantScope, plant: string | undefined): PlantScope {
  return plant !== undefined ? [plant] : scope;
}
