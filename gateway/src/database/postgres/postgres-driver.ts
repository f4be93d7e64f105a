import { types } from 'pg';
import type { DataSource, QueryRunner, ReplicationMode } from 'typeorm';
import { toNumberedPlaceholders } from './placeholders';

/** OIDs of PostgreSQL's int8 and numeric (the pg_type catalogue). */
const INT8 = 20;
const NUMERIC = 1700;

/**
 * Makes a PostgreSQL DataSource answer as the SQLite one does, so the services need no per-driver
 * code: int8 (epoch ms, ids, COUNT) and numeric (SUM, AVG) come back as JS numbers instead of
 * strings (ms since 1970 stay far below 2^53), and raw SQL written with `?` gets $n placeholders.
 */
export function preparePostgres(dataSource: DataSource): DataSource {
  types.setTypeParser(INT8, (v) => Number(v));
  types.setTypeParser(NUMERIC, (v) => Number(v));
  const driver = dataSource.driver;
  const create = driver.createQueryRunner.bind(driver);
  driver.createQueryRunner = (mode: ReplicationMode): QueryRunner => {
    const runner = create(mode);
    const query = runner.query.bind(runner);
    runner.query = ((sql: string, params?: unknown[], structured?: boolean) =>
      query(
        params?.length ? toNumberedPlaceholders(sql) : sql,
        params,
        structured as never,
      )) as QueryRunner['query'];
    return runner;
  };
  return dataSource;
}
