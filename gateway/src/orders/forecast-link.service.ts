import { Injectable, Logger } from '@nestjs/common';
import { ModuleRef } from '@nestjs/core';
import type { FlowSeries } from '@stillwell/shared/hydraulics';
import type { ForecastLink } from '@stillwell/shared/orders';
import { ForecastsService } from '../forecasts/forecasts.service';
import { iso } from './order-view';

export interface CurrentForecast {
  link: ForecastLink;
  /** the run's inflow forecast, t in s from the site's now */
  inflow: { series: FlowSeries; label: string };
}

/**
 * The forecast run a draft rests on. Looked up at run time, so that the orders module works (and
 * says "no forecast run") where the forecasts module is not registered.
 */
@Injectable()
export class ForecastLinkService {
  private readonly logger = new Logger(ForecastLinkService.name);

  constructor(private readonly moduleRef: ModuleRef) {}

  async current(reservoirId: string, siteNowMs: number): Promise<CurrentForecast | null> {
    let forecasts: ForecastsService;
    try {
      forecasts = this.moduleRef.get(ForecastsService, { strict: false });
    } catch {
      return null;
    }
    try {
      const run = await forecasts.latest(reservoirId);
      if (!run) return null;
      const { series, peak, timeLeft } = run;
      const t = series.inflow.map((_, k) => (series.startMs - siteNowMs) / 1000 + k * series.stepS);
      return {
        link: {
          runId: String(run.id),
          issuedAt: iso(run.computedAtMs),
          summary:
            `peak ${peak.elevation.toFixed(2)} m (p90 ${peak.p90.toFixed(2)} m) ` +
            `${((peak.timeMs - run.computedAtMs) / 3_600_000).toFixed(1)} h after the run, with the gates held; ${timeLeft.message}`,
        },
        inflow: {
          series: { t, q: series.inflow },
          label: `inflow of forecast run ${run.id} (${run.inputs.inflow.method}, computed ${iso(run.computedAtMs)})`,
        },
      };
    } catch (error) {
      this.logger.warn(`No forecast for the draft: ${(error as Error).message}`);
      return null;
    }
  }
}
