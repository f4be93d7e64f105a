import { Injectable, Logger, OnModuleInit } from '@nestjs/common';
import {
  CLOCK_SUBSCRIPTION,
  parseTopic,
  siteClockMessageSchema,
  type SiteClock,
} from '@stillwell/shared/telemetry';
import { MqttService } from '../mqtt/mqtt.service';

interface ClockAnchor {
  siteMs: number;
  wallMs: number;
  speed: number;
  lastNow: number;
}

/**
 * Each reservoir's "now". In production that is the wall clock. The simulator publishes its plant
 * clock so that a storm can run faster than real time; then ages, staleness and future-time checks
 * follow plant time, extrapolated between clock messages so that a silent simulator still ages data.
 */
@Injectable()
export class SiteClockService implements OnModuleInit {
  private readonly logger = new Logger(SiteClockService.name);
  private readonly anchors = new Map<string, ClockAnchor>();

  constructor(
    private readonly mqtt: MqttService,
    private readonly wallClock: () => number = Date.now,
  ) {}

  onModuleInit(): void {
    this.mqtt.subscribe(CLOCK_SUBSCRIPTION, (topic, payload) => this.accept(topic, payload));
  }

  accept(topic: string, payload: Buffer): void {
    const parsed = parseTopic(topic);
    let message: unknown;
    try {
      message = JSON.parse(payload.toString('utf8'));
    } catch {
      message = undefined;
    }
    const result = siteClockMessageSchema.safeParse(message);
    if (!parsed || parsed.kind !== 'clock' || !result.success) {
      this.logger.warn(`Ignored a malformed clock message on ${topic}`);
      return;
    }
    const previous = this.anchors.get(parsed.reservoirId);
    this.anchors.set(parsed.reservoirId, {
      siteMs: Date.parse(result.data.siteTime),
      wallMs: this.wallClock(),
      speed: result.data.speed,
      lastNow: previous?.lastNow ?? -Infinity,
    });
  }

  /** The site's time, epoch ms; never goes backwards while the process runs. */
  now(reservoirId: string): number {
    const anchor = this.anchors.get(reservoirId);
    if (!anchor) return this.wallClock();
    const now = Math.max(
      anchor.lastNow,
      anchor.siteMs + (this.wallClock() - anchor.wallMs) * anchor.speed,
    );
    anchor.lastNow = now;
    return now;
  }

  snapshot(reservoirId: string): SiteClock {
    const anchor = this.anchors.get(reservoirId);
    return {
      now: this.now(reservoirId),
      speed: anchor?.speed ?? 1,
      simulated: anchor !== undefined,
    };
  }
}
