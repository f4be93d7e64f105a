import Database from 'better-sqlite3';
const file = '/tmp/sw-report-bench/week.sqlite';
const RES = 'lake-orrin';
const T0 = Date.UTC(2026, 0, 1);
const T1 = T0 + 7 * 86_400_000;
function time<T>(label: string, f: () => T): T {
  const s = performance.now();
  const r = f();
  console.log(label, ((performance.now() - s) / 1000).toFixed(2), 's');
  return r;
}
for (const mmap of [0, 4 * 2 ** 30]) {
  const db = new Database(file, { readonly: true, fileMustExist: true });
  if (mmap) db.pragma(`mmap_size = ${mmap}`);
  console.log('mmap', mmap);
  time('count 20', () => {
    const st = db.prepare('SELECT COUNT(*) AS n FROM readings WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ?');
    let n = 0;
    for (const c of db.prepare('SELECT DISTINCT channel FROM readings WHERE reservoir_id = ?').pluck().all(RES) as string[]) n += (st.get(RES, c, T0, T1) as { n: number }).n;
    return n;
  });
  for (const ch of ['pool.radar', 'inflow']) {
    time(`iterate ${ch}`, () => {
      const st = db.prepare('SELECT time, value, quality FROM readings WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ? ORDER BY time, id').raw(true);
      let n = 0;
      for (const r of st.iterate(RES, ch, T0, T1)) n += (r as unknown[]).length;
      return n;
    });
    time(`all ${ch}`, () => {
      const st = db.prepare('SELECT time, value, quality FROM readings WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ? ORDER BY time, id').raw(true);
      return st.all(RES, ch, T0, T1).length;
    });
  }
  console.log(db.prepare("EXPLAIN QUERY PLAN SELECT time, value, quality FROM readings WHERE reservoir_id = ? AND channel = ? AND time >= ? AND time < ? ORDER BY time, id").all('a','b',1,2));
  db.close();
}
