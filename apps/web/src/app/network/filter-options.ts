import { type Signal, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import type { CountryDto, PlantDto } from '@keelson/contracts';
import { catchError, of } from 'rxjs';
import { CountriesApi } from '../admin/countries-api';
import { PlantsApi } from '../admin/plants-api';
import { Session } from '../auth/session';

/**
 * The plants for a table's plant filter: a plant manager is offered only their own plants (the
 * API refuses the others). A failed read leaves the list empty (the filter then offers only
 * "All plants") rather than breaking the table. Call it in an injection context.
 */
export function plantOptions(): Signal<PlantDto[]> {
  const session = inject(Session);
  const plants = toSignal(
    inject(PlantsApi)
      .list()
      .pipe(catchError(() => of([] as PlantDto[]))),
    { initialValue: [] as PlantDto[] },
  );
  return computed(() => {
    const user = session.user();
    if (user?.role !== 'plant_manager') {
      return plants();
    }
    return plants().filter((plant) => user.plantCodes.includes(plant.code));
  });
}

/** The countries for the country and region filters (empty when they cannot be read). */
export function countryOptions(): Signal<CountryDto[]> {
  return toSignal(
    inject(CountriesApi)
      .list()
      .pipe(catchError(() => of([] as CountryDto[]))),
    { initialValue: [] as CountryDto[] },
  );
}
