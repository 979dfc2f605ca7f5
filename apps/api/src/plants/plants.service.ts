import type { PlantDetailDto, PlantDto } from '@keelson/contracts';
import type { SessionUser } from '../http/auth-context';
import { forbidden, notFound } from '../http/app-error';
import type { PlantsRepository } from './plants.repository';

/** Reading plants, with plant-scoped access decided here rather than in the client. */
export class PlantsService {
  constructor(private readonly plants: PlantsRepository) {}

  /**
   * Every plant's code, name and country, for anyone signed in (a plant manager sees the other
   * plants' names too, for context; their details stay scoped, see {@link get}).
   */
  list(): PlantDto[] {
    return this.plants.list().map(({ code, name, country }) => ({ code, name, country }));
  }

  /**
   * One plant with its managers. Administrators read any plant; a plant manager only the plants
   * they manage (403 otherwise); buyers, risk managers and viewers read every plant.
   */
  get(viewer: SessionUser, code: string): PlantDetailDto {
    if (viewer.role === 'plant_manager' && !viewer.plantCodes.includes(code)) {
      const managed =
        viewer.plantCodes.length > 0 ? viewer.plantCodes.join(', ') : 'no plant yet';
      throw forbidden(`You manage ${managed}; plant ${code} is not one of them.`, {
        plantCode: code,
        managedPlantCodes: viewer.plantCodes,
      });
    }
    const plant = this.plants.find(code);
    if (!plant) {
      throw notFound(`There is no plant with code ${code}.`);
    }
    return { ...plant, managers: this.plants.managersOf(code) };
  }
}
