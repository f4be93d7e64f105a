import { Injectable, OnApplicationBootstrap } from '@nestjs/common';
import { Interval } from '@nestjs/schedule';
import { Subject } from 'rxjs';
import type { VerificationReport } from '@stillwell/shared/logbook';
import { LeaseService } from '../database/lease.service';
import { LogbookService } from './logbook.service';

/** Verifies the chain at start and every ten minutes, and keeps the last result for the console. */
@Injectable()
export class LogbookVerifier implements OnApplicationBootstrap {
  last: VerificationReport | null = null;
  readonly reports$ = new Subject<VerificationReport>();

  constructor(
    private readonly logbook: LogbookService,
    private readonly lease: LeaseService,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.run();
  }

  @Interval('logbook-verify', 10 * 60 * 1000)
  async scheduled(): Promise<void> {
    // one gateway verifies for all; the lease outlasts the interval
    if (!(await this.lease.acquire('logbook-verify', 15 * 60 * 1000))) return;
    await this.run();
  }

  async run(published?: { seq: number; hash: string }): Promise<VerificationReport> {
    const report = await this.logbook.verify(published);
    if (!published) {
      this.last = report;
      this.reports$.next(report);
    }
    return report;
  }
}
