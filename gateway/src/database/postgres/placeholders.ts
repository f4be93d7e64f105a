/**
 * Raw SQL in the services is written with `?` placeholders (SQLite's and most drivers' style);
 * PostgreSQL numbers them ($1, $2, ...). This rewrites `?` outside quotes and comments, once per
 * statement text, so that the same SQL runs on both. SQL that already numbers its placeholders
 * (TypeORM's own for PostgreSQL) is left as it is.
 */
const cache = new Map<string, string>();

export function toNumberedPlaceholders(sql: string): string {
  if (!sql.includes('?') || /\$\d/.test(sql)) return sql;
  const hit = cache.get(sql);
  if (hit !== undefined) return hit;
  let out = '';
  let n = 0;
  for (let i = 0; i < sql.length; i += 1) {
    const c = sql[i]!;
    if (c === "'" || c === '"') {
      // a quoted string or identifier, with its doubled quotes, copied as it is
      let j = i + 1;
      for (; j < sql.length; j += 1) {
        if (sql[j] === c) {
          if (sql[j + 1] === c) j += 1;
          else break;
        }
      }
      out += sql.slice(i, j + 1);
      i = j;
    } else if (c === '-' && sql[i + 1] === '-') {
      const end = sql.indexOf('\n', i);
      const j = end < 0 ? sql.length : end;
      out += sql.slice(i, j);
      i = j - 1;
    } else if (c === '?') {
      n += 1;
      out += `$${n}`;
    } else out += c;
  }
  if (cache.size < 1000) cache.set(sql, out);
  return out;
}
