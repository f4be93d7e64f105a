import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { Injectable, Logger, NotFoundException, OnModuleDestroy } from '@nestjs/common';
import type { ReportFormat, ReportJob, ReportStage } from '@stillwell/shared/reports';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { writeReadingsCsv } from './csv-export';
import { reportDocument } from './pdf/report-document';
import { renderPdf } from './pdf/render-pdf';
import { ReportBuilder } from './report-builder.service';

/** Jobs kept (newest first); older ones are dropped with their files. */
const KEEP_JOBS = 20;
/** A finished job's files are kept this long. */
const KEEP_MS = 60 * 60 * 1000;

interface JobRecord {
  job: ReportJob;
  ownerId: string;
  dir: string;
  files: Partial<Record<ReportFormat, string>>;
  reservoirName: string;
}

/**
 * Report generation as jobs: created at once, built one at a time behind each other (the
 * machine's cores are shared with ingestion), progress kept for polling, results on disk in a
 * private temporary folder until the job is dropped.
 */
@Injectable()
export class ReportJobs implements OnModuleDestroy {
  private readonly logger = new Logger(ReportJobs.name);
  private readonly jobs = new Map<string, JobRecord>();
  private chain: Promise<void> = Promise.resolve();

  constructor(
    private readonly builder: ReportBuilder,
    private readonly reservoirs: ReservoirsService,
  ) {}

  onModuleDestroy(): void {
    for (const r of this.jobs.values()) rmSync(r.dir, { recursive: true, force: true });
    this.jobs.clear();
  }

  create(
    reservoirId: string,
    window: { from: number; to: number; formats: ReportFormat[] },
    ownerId: string,
  ): ReportJob {
    this.prune();
    const { definition } = this.reservoirs.get(reservoirId);
    const id = randomUUID();
    const record: JobRecord = {
      job: {
        id,
        reservoirId,
        from: new Date(window.from).toISOString(),
        to: new Date(window.to).toISOString(),
        formats: [...new Set(window.formats)],
        stage: 'queued',
        percent: 0,
        rows: null,
        error: null,
        createdAt: new Date().toISOString(),
        finishedAt: null,
      },
      ownerId,
      dir: mkdtempSync(join(tmpdir(), 'stillwell-report-')),
      files: {},
      reservoirName: definition.name,
    };
    this.jobs.set(id, record);
    this.chain = this.chain.then(() =>
      this.run(record, window.from, window.to, definition.timeZone).catch((error: unknown) => {
        this.logger.error(`Report ${id} failed: ${String(error)}`);
        this.set(record, 'failed', record.job.percent);
        record.job.error = error instanceof Error ? error.message : String(error);
        record.job.finishedAt = new Date().toISOString();
      }),
    );
    return { ...record.job };
  }

  /** A job of this owner; others' jobs are not found (a report may hold what they may not see). */
  get(reservoirId: string, id: string, ownerId: string): ReportJob {
    return { ...this.record(reservoirId, id, ownerId).job };
  }

  /** The file of a finished job, with a download name. */
  result(
    reservoirId: string,
    id: string,
    ownerId: string,
    format: ReportFormat,
  ): { path: string; name: string } | null {
    const r = this.record(reservoirId, id, ownerId);
    const path = r.files[format];
    if (r.job.stage !== 'done' || !path) return null;
    const stamp = (iso: string) => iso.slice(0, 16).replace(/[:]/g, '');
    const base = `stillwell-${r.job.reservoirId}-${stamp(r.job.from)}-to-${stamp(r.job.to)}`;
    return { path, name: format === 'csv' ? `${base}-readings.csv` : `${base}.${format}` };
  }

  /** Resolves when every job queued so far has finished (tests, shutdown). */
  settled(): Promise<void> {
    return this.chain;
  }

  private record(reservoirId: string, id: string, ownerId: string): JobRecord {
    const r = this.jobs.get(id);
    if (!r || r.ownerId !== ownerId || r.job.reservoirId !== reservoirId)
      throw new NotFoundException(`No report job ${id} of yours for reservoir "${reservoirId}"`);
    return r;
  }

  private set(r: JobRecord, stage: ReportStage, percent: number): void {
    r.job.stage = stage;
    r.job.percent = Math.max(r.job.percent, Math.min(100, Math.round(percent * 10) / 10));
  }

  private async run(r: JobRecord, from: number, to: number, timeZone: string): Promise<void> {
    const { formats, reservoirId } = r.job;
    const wantCsv = formats.includes('csv');
    // the share of the bar each part takes
    const buildEnd = wantCsv ? 55 : 85;
    const report = await this.builder.build(reservoirId, from, to, (stage, pct) =>
      this.set(r, stage, (pct / 60) * buildEnd),
    );
    if (formats.includes('json')) {
      r.files.json = join(r.dir, 'report.json');
      writeFileSync(r.files.json, JSON.stringify(report, null, 1));
    }
    if (formats.includes('pdf')) {
      this.set(r, 'charts', buildEnd + 2);
      const doc = reportDocument(report, timeZone);
      this.set(r, 'pdf', buildEnd + 5);
      r.files.pdf = join(r.dir, 'report.pdf');
      writeFileSync(r.files.pdf, await renderPdf(doc));
    }
    if (wantCsv) {
      this.set(r, 'csv', 65);
      const source = this.builder.openReadings();
      try {
        const channels = source.channels(reservoirId);
        const total = source.count(reservoirId, channels, from, to);
        r.job.rows = { done: 0, total };
        const path = join(r.dir, 'readings.csv');
        await writeReadingsCsv(source, { reservoirId, channels, from, to }, path, (done) => {
          r.job.rows = { done, total };
          this.set(r, 'csv', 65 + (total ? (done / total) * 34 : 34));
        });
        r.files.csv = path;
      } finally {
        source.close();
      }
    }
    r.job.stage = 'done';
    r.job.percent = 100;
    r.job.finishedAt = new Date().toISOString();
  }

  private prune(): void {
    const now = Date.now();
    const list = [...this.jobs.values()].sort((a, b) =>
      b.job.createdAt.localeCompare(a.job.createdAt),
    );
    list.forEach((r, i) => {
      const finished = r.job.finishedAt ? Date.parse(r.job.finishedAt) : null;
      const expired = finished !== null && now - finished > KEEP_MS;
      if ((i >= KEEP_JOBS - 1 && finished !== null) || expired) {
        rmSync(r.dir, { recursive: true, force: true });
        this.jobs.delete(r.job.id);
      }
    });
  }
}
