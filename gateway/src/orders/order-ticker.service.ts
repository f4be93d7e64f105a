import {
  Inject,
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import type { Subscription } from 'rxjs';
import { controlsOf } from '@stillwell/shared/orders';
import { ACK_SUBSCRIPTION } from '@stillwell/shared/telemetry';
import { LeaseService } from '../database/lease.service';
import { MqttService } from '../mqtt/mqtt.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ActuatorPositions } from './actuator-positions.service';
import { OrderAcks } from './order-acks.service';
import { OrderExecution } from './order-execution.service';
import { OrderProgress } from './order-progress.service';
import { ORDER_SETTINGS } from './order-tokens';
import type { OrderSettings } from './order-settings';

/**
 * Drives orders forward: acknowledgements as they arrive, position checks on every stored
 * position report, and a sweep every ORDER_TICK_MS for deadlines, due steps and lapsed
 * authorisations. Tests set the tick to 0 and call `sweep()` themselves.
 */
@Injectable()
export class OrderTicker implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(OrderTicker.name);
  private timer?: NodeJS.Timeout;
  private subscription?: Subscription;
  private checking: Promise<void> | null = null;
  private again = false;
  private closed = false;

  constructor(
    private readonly mqtt: MqttService,
    private readonly reservoirs: ReservoirsService,
    private readonly positions: ActuatorPositions,
    private readonly execution: OrderExecution,
    private readonly acks: OrderAcks,
    private readonly progress: OrderProgress,
    @Inject(ORDER_SETTINGS) private readonly settings: OrderSettings,
    private readonly lease: LeaseService,
  ) {}

  onApplicationBootstrap(): void {
    for (const { id } of this.reservoirs.list()) {
      const { definition } = this.reservoirs.get(id);
      this.positions.watch(
        id,
        controlsOf(definition).map((c) => c.channel),
      );
    }
    this.mqtt.subscribe(ACK_SUBSCRIPTION, (_topic, payload) => {
      // the broker connection outlives this module at shutdown: later acks find no database
      // with several gateways, the one holding the sweep drives the orders
      if (this.closed || !this.lease.holds('order-sweep')) return;
      this.acks.onAck(payload).catch((e: unknown) => this.fail('acknowledgement', e));
    });
    this.subscription = this.positions.updated$.subscribe(() => this.positionsChanged());
    if (this.settings.tickMs > 0) {
      this.timer = setInterval(() => void this.sweep(), this.settings.tickMs);
      this.timer.unref();
    }
  }

  onModuleDestroy(): void {
    this.closed = true;
    clearInterval(this.timer);
    this.subscription?.unsubscribe();
  }

  /** One pass over everything time-driven. */
  async sweep(wallNow = Date.now()): Promise<void> {
    if (!(await this.lease.acquire('order-sweep'))) return;
    try {
      await this.acks.checkAckDeadlines(wallNow);
      await this.progress.checkPositions();
      await this.execution.dispatchDue();
      await this.execution.lapseExpired();
    } catch (error) {
      this.fail('sweep', error);
    }
  }

  /** Coalesced: position reports arrive in bursts, one check at a time is enough. */
  private positionsChanged(): void {
    if (!this.lease.holds('order-sweep')) return;
    if (this.checking) {
      this.again = true;
      return;
    }
    this.checking = this.progress
      .checkPositions()
      .catch((e: unknown) => this.fail('position check', e))
      .finally(() => {
        this.checking = null;
        if (this.again) {
          this.again = false;
          this.positionsChanged();
        }
      });
  }

  private fail(what: string, error: unknown): void {
    this.logger.error(`Order ${what} failed: ${(error as Error).stack ?? String(error)}`);
  }
}
