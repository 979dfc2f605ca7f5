/**
 * SQL fragments shared by the network repositories: LIKE patterns with escaped wildcards, value
 * lists, and the "serves one of these plants" test on `network_supplier_plants`.
 */
import { sql, type SQL, type SQLWrapper } from 'drizzle-orm';

/**
 * A LIKE pattern that finds `text` anywhere, with `%`, `_` and `\` escaped (use with
 * `escape '\'`), so a search for `50%` finds the text `50%` only. SQLite's LIKE ignores the
 * case of ASCII letters.
 */
export function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/** `column like '%text%' escape '\'` for a search box. */
export function contains(column: SQLWrapper, text: string): SQL {
  return sql`${column} like ${likePattern(text)} escape '\\'`;
}

/** `(v1, v2, ...)` as bound parameters; callers handle the empty list. */
export function valueList(values: readonly string[]): SQL {
  return sql`(${sql.join(values.map((value) => sql`${value}`), sql`, `)})`;
}

/**
 * `column in (<suppliers of the version serving one of plants>)`, directly or through other
 * suppliers (`network_supplier_plants`, derived at commit); false for an empty list. The
 * subquery does not depend on the outer row, so SQLite builds the set once per statement
 * (through the table's plant index) instead of probing it row by row.
 */
export function servesAnyOf(
  versionId: number,
  supplierCode: SQLWrapper,
  plants: readonly string[],
): SQL {
  if (plants.length === 0) return sql`0`;
  return sql`${supplierCode} in (select sp.supplier_code from network_supplier_plants sp
    where sp.version_id = ${versionId} and sp.plant_code in ${valueList(plants)})`;
}

/** Sort key that puts nulls last whichever the direction. */
export function nullsLast(column: SQLWrapper): SQL {
  return sql`${column} is null`;
}
