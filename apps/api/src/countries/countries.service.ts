import type { CountryDto, UpdateCountryInput } from '@keelson/contracts';
import { invalidRequest } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { CountriesRepository, CountryRecord } from './countries.repository';
import { DEFAULT_COUNTRIES } from './default-countries';

/**
 * The country hazard table: every signed-in user reads it, administrators rate countries. A
 * rating an administrator sets is no longer a default (`isDefault: false`).
 */
export class CountriesService {
  constructor(
    private readonly countries: CountriesRepository,
    private readonly now: () => Date,
  ) {}

  /**
   * Inserts the shipped rows (invented placeholder hazards, `isDefault: true`) when the table is
   * empty; leaves a table that holds anything alone. Returns the number of rows inserted.
   */
  seedDefaults(): number {
    return this.countries.transaction(() => {
      if (this.countries.countAll() > 0) return 0;
      const updatedAt = this.now().toISOString();
      this.countries.insert(DEFAULT_COUNTRIES.map((country) => ({
        ...country, isDefault: true, updatedAt, updatedBy: null,
      })));
      return DEFAULT_COUNTRIES.length;
    });
  }

  /** Every country, by code. */
  list(): CountryDto[] {
    return this.countries.list().map(toCountryDto);
  }

  /** Hazard rating per country code, for the analysis. */
  hazards(): Map<string, number> {
    return new Map(this.countries.list().map((row) => [row.code, row.hazard]));
  }

  /**
   * Sets a country's hazard (and name or region when given), marking it reviewed. A code not in
   * the table is added, which needs a name and a region (400 naming the missing field).
   */
  update(actor: SessionUser, code: string, input: UpdateCountryInput): CountryDto {
    const changes = {
      hazard: input.hazard,
      ...(input.name !== undefined ? { name: input.name } : {}),
      ...(input.region !== undefined ? { region: input.region } : {}),
      isDefault: false,
      updatedAt: this.now().toISOString(),
      updatedBy: actor.id,
    };
    this.countries.transaction(() => {
      if (this.countries.find(code)) {
        this.countries.update(code, changes);
        return;
      }
      const missing = (['name', 'region'] as const).filter((field) => input[field] === undefined);
      if (missing.length > 0) {
        const issues = missing.map((field) => ({
          path: `body.${field}`,
          message: `Required to add country ${code}, which is not in the table yet.`,
        }));
        throw invalidRequest(`The request is not valid: ${issues[0]!.path}: ${issues[0]!.message}`,
          { issues });
      }
      this.countries.insert([{ code, name: input.name!, region: input.region!, ...changes }]);
    });
    return toCountryDto(this.countries.find(code)!);
  }
}

function toCountryDto(row: CountryRecord): CountryDto {
  return {
    code: row.code,
    name: row.name,
    region: row.region,
    hazard: row.hazard,
    isDefault: row.isDefault,
    updatedAt: row.updatedAt,
    updatedBy: row.updatedByName,
  };
}
