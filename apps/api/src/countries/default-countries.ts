/**
 * The country table shipped with Keelson, inserted once into an empty `countries` table.
 *
 * The hazard ratings (1 low - 5 high) are INVENTED PLACEHOLDERS so that a fresh workspace can
 * show country risk at all. They are not taken from, and do not stand for, any published index
 * or assessment. Every row is stored with `isDefault: true` until an administrator reviews it
 * (PUT /api/countries/:code), which is the intended first step before relying on them.
 *
 * Names are English short names and codes ISO 3166-1 alpha-2. The list covers every country of
 * the demo workbook (tools/demo-network.ts), of the test-network generator and of the worked
 * example, plus other common sourcing countries; admins add others with PUT.
 */

/** The regions the country table groups by. */
export const COUNTRY_REGIONS = [
  'Europe', 'Asia', 'Americas', 'Africa', 'Oceania', 'Middle East',
] as const;

/** A shipped country row. */
export interface DefaultCountry {
  code: string;
  name: string;
  region: (typeof COUNTRY_REGIONS)[number];
  /** Invented placeholder, 1 (low) to 5 (high). */
  hazard: number;
}

const row = (
  code: string,
  name: string,
  region: DefaultCountry['region'],
  hazard: number,
): DefaultCountry => ({ code, name, region, hazard });

/** The shipped rows, by code. Hazards are invented placeholders (see the file header). */
export const DEFAULT_COUNTRIES: readonly DefaultCountry[] = [
  row('AE', 'United Arab Emirates', 'Middle East', 2),
  row('AR', 'Argentina', 'Americas', 3),
  row('AT', 'Austria', 'Europe', 1),
  row('AU', 'Australia', 'Oceania', 2),
  row('BE', 'Belgium', 'Europe', 1),
  row('BR', 'Brazil', 'Americas', 3),
  row('CA', 'Canada', 'Americas', 1),
  row('CH', 'Switzerland', 'Europe', 1),
  row('CL', 'Chile', 'Americas', 3),
  row('CN', 'China', 'Asia', 3),
  row('CZ', 'Czechia', 'Europe', 1),
  row('DE', 'Germany', 'Europe', 1),
  row('DK', 'Denmark', 'Europe', 1),
  row('EG', 'Egypt', 'Africa', 4),
  row('ES', 'Spain', 'Europe', 2),
  row('FI', 'Finland', 'Europe', 1),
  row('FR', 'France', 'Europe', 1),
  row('GB', 'United Kingdom', 'Europe', 1),
  row('HU', 'Hungary', 'Europe', 2),
  row('ID', 'Indonesia', 'Asia', 4),
  row('IL', 'Israel', 'Middle East', 4),
  row('IN', 'India', 'Asia', 3),
  row('IT', 'Italy', 'Europe', 2),
  row('JP', 'Japan', 'Asia', 3),
  row('KR', 'South Korea', 'Asia', 2),
  row('MA', 'Morocco', 'Africa', 3),
  row('MX', 'Mexico', 'Americas', 3),
  row('MY', 'Malaysia', 'Asia', 2),
  row('NL', 'Netherlands', 'Europe', 1),
  row('NZ', 'New Zealand', 'Oceania', 2),
  row('PH', 'Philippines', 'Asia', 4),
  row('PL', 'Poland', 'Europe', 1),
  row('PT', 'Portugal', 'Europe', 1),
  row('RO', 'Romania', 'Europe', 2),
  row('SA', 'Saudi Arabia', 'Middle East', 3),
  row('SE', 'Sweden', 'Europe', 1),
  row('SG', 'Singapore', 'Asia', 1),
  row('SK', 'Slovakia', 'Europe', 2),
  row('TH', 'Thailand', 'Asia', 3),
  row('TN', 'Tunisia', 'Africa', 3),
  row('TR', 'Türkiye', 'Europe', 3),
  row('TW', 'Taiwan', 'Asia', 4),
  row('US', 'United States', 'Americas', 2),
  row('VN', 'Vietnam', 'Asia', 3),
  row('ZA', 'South Africa', 'Africa', 3),
];
