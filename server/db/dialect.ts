// SQL that differs between SQLite and PostgreSQL, chosen per dialect here and nowhere else.
import { literal, type Sequelize } from 'sequelize';

export type Dialect = 'sqlite' | 'postgres';

export function dialectOf(db: Sequelize): Dialect {
  const d = db.getDialect();
  if (d === 'sqlite' || d === 'postgres') return d;
  throw new Error(`unsupported database dialect: ${d}`);
}

/**
 * A WHERE condition: the JSON array column `column` (quoted, e.g. `"BenchSession"."tags"`)
 * holds the string `value`. SQLite walks the array with json_each; PostgreSQL with
 * json_array_elements_text (the column is `json`, not `jsonb`, so no containment operator).
 */
export function jsonArrayContains(db: Sequelize, column: string, value: string) {
  const v = db.escape(value);
  return dialectOf(db) === 'postgres'
    ? literal(`EXISTS (SELECT 1 FROM json_array_elements_text(${column}) AS tag WHERE tag = ${v})`)
    : literal(`EXISTS (SELECT 1 FROM json_each(${column}) WHERE json_each.value = ${v})`);
}
