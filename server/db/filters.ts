// Filters shared by the list queries, written once for both databases.
import { col, fn, Op, where } from 'sequelize';

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
