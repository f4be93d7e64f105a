import Database from 'better-sqlite3';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  Child,
  freePort,
  startBrokerProcess,
  startGatewayProcess,
  startSimulatorProcess,
  verifyLogbook,
  waitFor,
  type DeviceLedger,
} from './processes';

/** Fast enough for hours of storm in seconds, slow enough for two shared cores. */
export const STORM_SPEED = 1800;

export interface StoredSeqs {
  deviceId: string;
  rows: number;
  distinct: number;
  minSeq: number;
  maxSeq: number;
}

/** What the gateway's database holds, per device: rows, distinct sequence numbers, their span. */
export function storedSeqs(databasePath: string): Map<string, StoredSeqs> {
  const db = new Database(databasePath, { readonly: true, fileMustExist: true });
  try {
    const rows = db
      .prepare(
        `SELECT device_id AS deviceId, COUNT(*) AS rows, COUNT(DISTINCT seq) AS distinct_,
                MIN(seq) AS minSeq, MAX(seq) AS maxSeq
         FROM readings GROUP BY device_id`,
      )
      .all() as Array<Omit<StoredSeqs, 'distinct'> & { distinct_: number }>;
    return new Map(
      rows.map(({ distinct_, ...r }) => [r.deviceId, { ...r, distinct: distinct_ }] as const),
    );
  } finally {
    db.close();
  }
}

/** (device, seq) pairs stored more than once: must be none. */
export function duplicates(databasePath: string): unknown[] {
  const db = new Database(databasePath, { readonly: true, fileMustExist: true });
  try {
    return db
      .prepare(
        'SELECT device_id, seq, COUNT(*) AS n FROM readings GROUP BY device_id, seq HAVING COUNT(*) > 1 LIMIT 20',
      )
      .all();
  } finally {
    db.close();
  }
}

export function storedTotal(databasePath: string): number {
  let n = 0;
  for (const s of storedSeqs(databasePath).values()) n += s.rows;
  return n;
}

/** Sequence gap rows by outcome. */
export function gapStates(databasePath: string): Record<string, number> {
  const db = new Database(databasePath, { readonly: true, fileMustExist: true });
  try {
    const rows = db
      .prepare('SELECT state, COUNT(*) AS n FROM sequence_gaps GROUP BY state')
      .all() as Array<{ state: string; n: number }>;
    return Object.fromEntries(rows.map((r) => [r.state, r.n]));
  } finally {
    db.close();
  }
}

/** Throws unless every device's stored sequence numbers are exactly 0..lastSeq, once each. */
export function checkComplete(databasePath: string, ledger: readonly DeviceLedger[]): void {
  const stored = storedSeqs(databasePath);
  const short: string[] = [];
  for (const d of ledger) {
    const s = stored.get(d.deviceId);
    const want = d.lastSeq + 1;
    if (!s || s.rows !== want || s.distinct !== want || s.minSeq !== 0 || s.maxSeq !== d.lastSeq)
      short.push(`${d.deviceId}: produced 0..${d.lastSeq}, stored ${JSON.stringify(s ?? null)}`);
  }
  if (short.length) throw new Error(short.join('\n'));
}

/**
 * One storm run for a fault test: a broker, the simulator at speed and the built gateway, each a
 * real process, on free ports and a temporary SQLite file. `mqttUrl` lets a test put something
 * (a cuttable relay) between the clients and the broker.
 */
export class Storm {
  readonly dir = mkdtempSync(join(tmpdir(), 'stillwell-fault-'));
  readonly databasePath = join(this.dir, 'stillwell.sqlite');
  readonly clientId = `stillwell-fault-${process.pid}-${Date.now()}`;
  broker!: Child;
  gateway!: { child: Child; url: string; password: (role: string) => string };
  simulator!: Awaited<ReturnType<typeof startSimulatorProcess>>;
  private gatewayPort = 0;

  constructor(
    readonly brokerPort: number,
    private clientUrl: string,
  ) {}

  static async start(relay?: (brokerPort: number) => Promise<string>): Promise<Storm> {
    const brokerPort = await freePort();
    const storm = new Storm(brokerPort, `mqtt://127.0.0.1:${brokerPort}`);
    storm.broker = await startBrokerProcess(brokerPort);
    if (relay) storm.clientUrl = await relay(brokerPort);
    storm.gatewayPort = await freePort();
    await storm.startGateway();
    storm.simulator = await startSimulatorProcess({
      mqttUrl: storm.clientUrl,
      speed: STORM_SPEED,
      statsFile: join(storm.dir, 'sim-stats.json'),
    });
    return storm;
  }

  /** (Re)starts the gateway on the same file, port and MQTT client id (its persistent session). */
  async startGateway(): Promise<void> {
    this.gateway = await startGatewayProcess({
      port: this.gatewayPort,
      databasePath: this.databasePath,
      mqttUrl: this.clientUrl,
      clientId: this.clientId,
    });
  }

  async restartBroker(downMs: number, signal: NodeJS.Signals): Promise<void> {
    await this.broker.stop(signal);
    await new Promise((r) => setTimeout(r, downMs));
    this.broker = await startBrokerProcess(this.brokerPort);
  }

  /** Waits until the gateway has stored more than `n` readings. */
  async storedMoreThan(n: number, timeoutMs = 60_000): Promise<number> {
    return waitFor(
      `more than ${n} readings stored`,
      () => {
        const total = storedTotal(this.databasePath);
        if (total <= n) throw new Error(`${total} stored`);
        return total;
      },
      timeoutMs,
      250,
    );
  }

  /**
   * Stops the plant where it stands, waits until the gateway has every reading produced, and
   * returns the ledger with the logbook's verification.
   */
  async finish(): Promise<{
    ledger: DeviceLedger[];
    duplicates: unknown[];
    logbook: { ok: boolean; count: number };
    gaps: Record<string, number>;
    produced: number;
  }> {
    const ledger = await this.simulator.hold();
    await waitFor(
      'the gateway to hold every reading produced',
      () => checkComplete(this.databasePath, ledger),
      120_000,
      500,
    );
    const logbook = await verifyLogbook(this.gateway.url, this.gateway.password('operator'));
    // the gap rows are judged a moment after their readings land
    const gaps = await waitFor(
      'every gap judged',
      () => {
        const states = gapStates(this.databasePath);
        if (states.open) throw new Error(JSON.stringify(states));
        return states;
      },
      30_000,
      250,
    );
    const produced = ledger.reduce((n, d) => n + d.lastSeq + 1, 0);
    console.log(`${produced} readings produced and stored once each; gaps ${JSON.stringify(gaps)}`);
    return { ledger, duplicates: duplicates(this.databasePath), logbook, gaps, produced };
  }

  async stop(): Promise<void> {
    await this.simulator?.child.stop('SIGTERM');
    await this.gateway?.child.stop('SIGTERM');
    await this.broker?.stop('SIGTERM');
    rmSync(this.dir, { recursive: true, force: true });
  }

  /** The last output of every process, for a failure message. */
  outputs(): string {
    return [this.broker, this.gateway?.child, this.simulator?.child]
      .filter(Boolean)
      .map((c) => `--- ${c!.name}\n${c!.output.slice(-3000)}`)
      .join('\n');
  }
}
