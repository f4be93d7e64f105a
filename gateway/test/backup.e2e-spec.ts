import Database from 'better-sqlite3';
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connectAsync, type MqttClient } from 'mqtt';
import request from 'supertest';
import { telemetryTopic } from '@stillwell/shared/telemetry';
import { checkDatabase } from '../src/backup/database-check';
import { RestoreRefused, restoreBackup } from '../src/backup/restore-command';
import { IngestionService } from '../src/telemetry/ingestion.service';
import { ACCESS_TEST_ENV, signInAs } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = 'lake-orrin';
const RESTORE_CLI = join(__dirname, '..', 'dist', 'cli', 'restore.js');

describe('online backup and restore (real SQLite, readings streaming in)', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let device: MqttClient;
  let admin: string;
  let streaming = true;
  let stream: Promise<void>;
  const work = mkdtempSync(join(tmpdir(), 'stillwell-restore-'));
  const backupDir = join(work, 'backups');

  const storedKeys = (path: string): Set<string> => {
    const db = new Database(path, { readonly: true });
    try {
      const rows = db.prepare('SELECT device_id, seq FROM readings').all() as Array<{
        device_id: string;
        seq: number;
      }>;
      return new Set(rows.map((r) => `${r.device_id}/${r.seq}`));
    } finally {
      db.close();
    }
  };

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      BACKUP_DIR: backupDir,
      // 1.2 s: the schedule shows itself within the test
      BACKUP_INTERVAL_MIN: '0.02',
      BACKUP_KEEP: '5',
    });
    admin = (await signInAs(gateway, 'admin')).token;
    await eventually(async () => {
      const res = await request(gateway.url).get('/api/health');
      expect(res.body.info?.broker?.status).toBe('up');
    });
    device = await connectAsync(broker.url, { clientId: 'backup-field', protocolVersion: 4 });
    const t0 = Date.now() - 60 * 60_000;
    stream = (async () => {
      for (let seq = 0; streaming; seq++) {
        const message = {
          deviceId: 'pool-radar',
          channel: 'pool.radar',
          seq,
          time: new Date(t0 + seq * 100).toISOString(),
          value: 204.5,
          unit: 'm',
          quality: 'good',
        };
        await device.publishAsync(telemetryTopic(RES, 'pool-radar'), JSON.stringify(message), {
          qos: 1,
        });
        if (seq % 20 === 0) await new Promise((r) => setTimeout(r, 10));
      }
    })();
  });

  afterAll(async () => {
    streaming = false;
    await stream;
    await device?.endAsync();
    await gateway?.close();
    await broker?.stop();
    rmSync(work, { recursive: true, force: true });
  });

  it('takes backups on its schedule and keeps the newest N', async () => {
    await eventually(async () => {
      const res = await request(gateway.url)
        .get('/api/backups')
        .set('Authorization', `Bearer ${admin}`)
        .expect(200);
      expect(res.body).toHaveLength(5);
    }, 30_000);
  });

  it('backs up on demand while readings stream in; the restore holds the rows present then', async () => {
    const ingestion = gateway.app.get(IngestionService);
    await eventually(() => expect(ingestion.counters.stored).toBeGreaterThan(200));
    await ingestion.flush();
    const before = storedKeys(gateway.databasePath);

    const res = await request(gateway.url)
      .post('/api/backups')
      .set('Authorization', `Bearer ${admin}`)
      .expect(201);
    const backup = join(work, 'taken.sqlite');
    copyFileSync(join(backupDir, res.body.name as string), backup);
    await ingestion.flush();
    const after = storedKeys(gateway.databasePath);
    expect(after.size).toBeGreaterThan(before.size);
    expect(res.body).toMatchObject({ bytes: expect.any(Number), sha256: /^[0-9a-f]{64}$/ });

    const fresh = join(work, 'fresh', 'restored.sqlite');
    const { check, keptAside } = await restoreBackup(backup, fresh);
    expect(keptAside).toBeNull();
    expect(check.intact).toBe(true);
    expect(check.logbook.ok).toBe(true);
    const restored = storedKeys(fresh);
    expect([...before].filter((k) => !restored.has(k))).toEqual([]);
    expect([...restored].filter((k) => !after.has(k))).toEqual([]);
    expect((await checkDatabase(fresh)).logbook).toMatchObject({ ok: true });

    // the backup is in the logbook, with who took it and the file's hash
    const db = new Database(gateway.databasePath, { readonly: true });
    const entry = db
      .prepare(`SELECT actor_name, payload FROM logbook_entries WHERE kind = 'database.backup'`)
      .all() as Array<{ actor_name: string; payload: string }>;
    db.close();
    expect(entry).toEqual([
      { actor_name: 'admin', payload: expect.stringContaining(res.body.sha256 as string) },
    ]);
  });

  it('lets only an administrator take or list backups', async () => {
    const operator = (await signInAs(gateway, 'operator')).token;
    await request(gateway.url)
      .post('/api/backups')
      .set('Authorization', `Bearer ${operator}`)
      .expect(403);
    await request(gateway.url)
      .get('/api/backups')
      .set('Authorization', `Bearer ${operator}`)
      .expect(403);
  });

  it('refuses to restore over a database the gateway holds, and keeps it as it was', () => {
    expect(existsSync(RESTORE_CLI)).toBe(true);
    const backup = join(work, 'taken.sqlite');
    const before = storedKeys(gateway.databasePath).size;
    const run = spawnSync(process.execPath, [RESTORE_CLI, backup, '--db', gateway.databasePath], {
      encoding: 'utf8',
    });
    expect(run.status).toBe(1);
    expect(run.stderr).toMatch(/Restore refused: database .* is in use/);
    expect(storedKeys(gateway.databasePath).size).toBeGreaterThanOrEqual(before);
  });

  it('restores with the CLI over a stopped database, keeping the old one aside', () => {
    const target = join(work, 'target', 'stillwell.sqlite');
    const first = spawnSync(
      process.execPath,
      [RESTORE_CLI, join(work, 'taken.sqlite'), '--db', target],
      {
        encoding: 'utf8',
      },
    );
    expect(first.status).toBe(0);
    expect(first.stdout).toMatch(/Restored .*integrity ok, logbook of \d+ entries verifies/);
    const again = spawnSync(
      process.execPath,
      [RESTORE_CLI, join(work, 'taken.sqlite'), '--db', target],
      {
        encoding: 'utf8',
      },
    );
    expect(again.status).toBe(0);
    const kept = /kept at (\S+)/.exec(again.stdout)?.[1];
    expect(kept && existsSync(kept)).toBe(true);
  });

  it('refuses a backup whose logbook was altered, naming the entry', async () => {
    const altered = join(work, 'altered.sqlite');
    copyFileSync(join(work, 'taken.sqlite'), altered);
    const db = new Database(altered);
    // the append-only triggers stop ordinary SQL; someone with the file can drop them
    const triggers = db
      .prepare(
        `SELECT name FROM sqlite_master WHERE type = 'trigger' AND tbl_name = 'logbook_entries'`,
      )
      .all() as Array<{ name: string }>;
    for (const t of triggers) db.exec(`DROP TRIGGER "${t.name}"`);
    db.prepare(`UPDATE logbook_entries SET payload = '{"changed":true}' WHERE seq = 2`).run();
    db.close();
    const target = join(work, 'never', 'stillwell.sqlite');
    await expect(restoreBackup(altered, target)).rejects.toThrow(RestoreRefused);
    await expect(restoreBackup(altered, target)).rejects.toThrow(/entry 2: hash-mismatch/);
    expect(existsSync(target)).toBe(false);
  });
});
