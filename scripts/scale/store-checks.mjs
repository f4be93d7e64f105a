// What the shared PostgreSQL holds after the scale-out run: readings per device, the job leases
// and the scheduled forecast runs, read with plain SQL.
import pg from 'pg';

export async function withDatabase(url, fn) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** Rows and distinct (channel, seq) per device of the reservoir, and every stored key. */
export async function storedReadings(db, reservoirId) {
  const { rows } = await db.query(
    `SELECT device_id, COUNT(*)::int AS rows, COUNT(DISTINCT (channel, seq))::int AS distinct_keys
       FROM readings WHERE reservoir_id = $1 GROUP BY device_id ORDER BY device_id`,
    [reservoirId],
  );
  const keys = await db.query(
    `SELECT device_id || '/' || channel || '/' || seq AS key FROM readings WHERE reservoir_id = $1`,
    [reservoirId],
  );
  return { perDevice: rows, keys: new Set(keys.rows.map((r) => r.key)) };
}

export async function jobLeases(db) {
  const { rows } = await db.query(`SELECT job, holder FROM job_leases ORDER BY job`);
  return rows;
}

/**
 * Scheduled forecast runs (trigger schedule or startup) per reservoir and period of site time: a
 * job that ran on both gateways would show two in one period.
 */
export async function scheduledForecastRuns(db, everySiteMs) {
  const total = await db.query(
    `SELECT COUNT(*)::int AS n FROM forecast_runs WHERE "trigger" IN ('schedule', 'startup')`,
  );
  const doubled = await db.query(
    `SELECT reservoir_id, computed_at / $1 AS period, COUNT(*)::int AS n FROM forecast_runs
      WHERE "trigger" IN ('schedule', 'startup') GROUP BY 1, 2 HAVING COUNT(*) > 1`,
    [everySiteMs],
  );
  return { total: total.rows[0].n, doubled: doubled.rows };
}

export async function sequenceGaps(db, reservoirId) {
  const { rows } = await db.query(
    `SELECT COUNT(*)::int AS n FROM sequence_gaps WHERE reservoir_id = $1`,
    [reservoirId],
  );
  return rows[0].n;
}
