// Database errors the code reacts to, recognised the same way on both engines.

interface DriverError {
  code?: unknown;
  message?: unknown;
  constraint?: unknown;
  detail?: unknown;
}

/**
 * True when `error` is a unique-constraint (or primary-key) violation; with `column`, only one that involves that
 * column. SQLite says `UNIQUE constraint failed: shops.slug` (code SQLITE_CONSTRAINT_UNIQUE / _PRIMARYKEY);
 * PostgreSQL gives code 23505, the constraint's name and `Key (slug)=(…) already exists.` (that detail only when the
 * table has no row-level security).
 */
export function isUniqueViolation(error: unknown, column?: string): boolean {
  if (!error || typeof error !== 'object') return false;
  const e = error as DriverError;
  const code = String(e.code ?? '');
  const message = String(e.message ?? '');
  if (code === '23505') {
    if (!column) return true;
    // On a table under row-level security PostgreSQL leaves the detail out (it would show another shop's value), so
    // the constraint's name (`shops_slug`) must tell: the column as a word, or after the table name's underscore.
    return new RegExp(`(?:\\b|_)${column}\\b`).test(`${String(e.detail ?? '')} ${String(e.constraint ?? '')}`);
  }
  const sqlite = code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY' || /UNIQUE constraint failed/.test(message);
  if (!sqlite) return false;
  return !column || new RegExp(`\\.${column}\\b`).test(message);
}
