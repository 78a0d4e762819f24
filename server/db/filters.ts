// Filters and lookups shared by the list queries, written once for both databases.
import { col, fn, Op, where, type Model, type ModelStatic, type WhereOptions } from 'sequelize';

/**
 * The LIKE pattern of a case-insensitive "contains", compared with the lower-cased column (LIKE is
 * case-sensitive on PostgreSQL and not on SQLite); `%` and `_` in the needle are dropped.
 * @param needle - the text to find.
 * @returns the pattern.
 */
export function containsPattern(needle: string): string {
  return `%${needle.replace(/[%_]/g, '').toLowerCase()}%`;
}

/**
 * A case-insensitive "column contains" condition.
 * @param column - the qualified column, e.g. `Design.name`.
 * @param needle - the text to find.
 * @returns the condition.
 */
export function textContains(column: string, needle: string): ReturnType<typeof where> {
  return where(fn('lower', col(column)), { [Op.like]: containsPattern(needle) });
}

/**
 * Rows of a model by id, in one query, reading only `attributes` (the related rows of a list page).
 * @param model - the model.
 * @param ids - ids (repeats allowed; one page of rows' worth).
 * @param attributes - the columns to read, `id` included.
 * @returns the rows found, in no particular order.
 */
export async function rowsByIds<M extends Model>(model: ModelStatic<M>, ids: readonly number[], attributes: string[]): Promise<M[]> {
  const unique = [...new Set(ids)];
  return unique.length === 0 ? [] : model.findAll({ where: { id: unique } as WhereOptions, attributes });
}
