import { toNumberedPlaceholders } from './placeholders';

describe('toNumberedPlaceholders (PostgreSQL numbered parameters, $n)', () => {
  it.each([
    ['SELECT * FROM t WHERE a = ? AND b > ?', 'SELECT * FROM t WHERE a = $1 AND b > $2'],
    [`SELECT '?' AS q, "a?" FROM t WHERE x = ?`, `SELECT '?' AS q, "a?" FROM t WHERE x = $1`],
    [`SELECT 'it''s ?' FROM t WHERE x = ?`, `SELECT 'it''s ?' FROM t WHERE x = $1`],
    ['SELECT 1 -- why?\nFROM t WHERE x = ?', 'SELECT 1 -- why?\nFROM t WHERE x = $1'],
    ['SELECT * FROM t WHERE a = $1 AND b = $2', 'SELECT * FROM t WHERE a = $1 AND b = $2'],
    ['SELECT 1', 'SELECT 1'],
  ])('%s', (sql, expected) => {
    expect(toNumberedPlaceholders(sql)).toBe(expected);
  });
});
