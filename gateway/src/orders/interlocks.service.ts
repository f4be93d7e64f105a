import { Inject, Injectable } from '@nestjs/common';
import {
  checkStepsAgainst,
  controlsOf,
  interlockReport,
  releaseRamp,
  type InterlockCode,
  type InterlockReport,
  type Order,
  type OrderControl,
} from '@stillwell/shared/orders';
import type { ChannelState } from '@stillwell/shared/telemetry';
import { SiteClockService } from '../clock/site-clock.service';
import { MqttService } from '../mqtt/mqtt.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { StatusService } from '../telemetry/status.service';
import { ActuatorPositions } from './actuator-positions.service';
import { DOWNSTREAM_CLEARANCE, type DownstreamClearance } from './downstream-clearance';
import { iso } from './order-view';
import { ORDER_SETTINGS } from './order-tokens';
import type { OrderSettings } from './order-settings';

interface Outcome {
  code: InterlockCode;
  ok: boolean;
  message: string;
}

const fmt = (v: number, unit: string) => `${v.toFixed(unit === 'm' ? 2 : 1)} ${unit}`;
const list = (names: string[]) =>
  names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;

/**
 * The checks made before every command of an order (each step of a schedule is checked when it
 * is due). Each refusal is a sentence naming the gate, the figures and what to do.
 */
@Injectable()
export class InterlocksService {
  constructor(
    private readonly status: StatusService,
    private readonly reservoirs: ReservoirsService,
    private readonly positions: ActuatorPositions,
    private readonly mqtt: MqttService,
    private readonly clock: SiteClockService,
    @Inject(DOWNSTREAM_CLEARANCE) private readonly clearance: DownstreamClearance,
    @Inject(ORDER_SETTINGS) private readonly settings: OrderSettings,
  ) {}

  /**
   * Evaluates one step of an order now. `busy` names the controls other active orders are
   * driving (control id -> order id). Under an emergency, the checks the shared rules mark as
   * waivable are recorded as warnings instead of refusing.
   */
  async evaluate(
    order: Order,
    step: number,
    emergency: boolean,
    busy: ReadonlyMap<string, number> = new Map(),
  ): Promise<{ report: InterlockReport; clearance: string }> {
    const { definition } = this.reservoirs.get(order.reservoirId);
    const now = this.clock.now(order.reservoirId);
    const status = this.status.status(order.reservoirId);
    const controls = controlsOf(definition);
    const targets = order.steps[step]?.targets ?? [];
    const named = targets.map((t) => controls.find((c) => c.id === t.control));
    const known = named.filter((c): c is OrderControl => c !== undefined);
    const channel = (c: OrderControl) => status.channels.find((s) => s.channel === c.channel);
    const outcomes: Outcome[] = [];

    outcomes.push(
      this.mqtt.connected
        ? { code: 'link-down', ok: true, message: 'connected to the broker' }
        : {
            code: 'link-down',
            ok: false,
            message:
              'The gateway is not connected to the broker, so the command cannot be sent. Check the broker and the network; the order can be executed once the link is back.',
          },
    );
    outcomes.push(this.freshness(known, channel, status.pool !== null, definition.poolChannels));
    outcomes.push(this.atRest(order, known, busy, now));

    const problems = checkStepsAgainst(definition, [order.steps[step]!]);
    outcomes.push(
      problems.length
        ? {
            code: 'target-out-of-limits',
            ok: false,
            message: `${problems.map((p) => p.message).join('; ')}. Choose a target within the gate's travel.`,
          }
        : { code: 'target-out-of-limits', ok: true, message: 'every target is within its limits' },
    );

    const current: Record<string, number> = {};
    for (const c of controls) current[c.id] = channel(c)?.value ?? 0;
    if (status.pool === null) {
      outcomes.push({
        code: 'release-rate',
        ok: false,
        message: 'The change of release cannot be checked without a fresh pool reading.',
      });
    } else {
      const wanted = Object.fromEntries(targets.map((t) => [t.control, t.target]));
      const ramp = releaseRamp(definition, controls, status.pool.elevation, current, wanted);
      const max = this.settings.releaseRateMaxPerMin;
      const rate = Math.abs(ramp.steepestPerMin);
      const moving = known.filter((c) => wanted[c.id] !== current[c.id]).map((c) => c.id);
      const what = `Moving ${list(moving) || 'nothing'} would change the release from ${ramp.from.toFixed(0)} to ${ramp.to.toFixed(0)} m3/s, at up to ${rate.toFixed(0)} m3/s per minute`;
      outcomes.push(
        rate > max
          ? {
              code: 'release-rate',
              ok: false,
              message: `${what}; the allowed rate is ${max} m3/s per minute. Move fewer gates at once, or split the order into steps.`,
            }
          : { code: 'release-rate', ok: true, message: `${what} (allowed ${max})` },
      );
    }

    const verdict = await this.clearance.check(order, step);
    outcomes.push(
      verdict.ok
        ? { code: 'downstream-clearance', ok: true, message: verdict.note }
        : { code: 'downstream-clearance', ok: false, message: verdict.reason },
    );
    return {
      report: interlockReport(outcomes, emergency, iso(now)),
      clearance: verdict.ok ? verdict.note : verdict.reason,
    };
  }

  private freshness(
    controls: readonly OrderControl[],
    channel: (c: OrderControl) => ChannelState | undefined,
    poolKnown: boolean,
    poolChannels: readonly string[],
  ): Outcome {
    const bad: string[] = [];
    for (const c of controls) {
      const s = channel(c);
      if (!s) bad.push(`${c.label}: no position reading yet`);
      else if (s.quality !== 'good')
        bad.push(`${c.label}: its position reading is marked ${s.quality}`);
      else if (s.stale)
        bad.push(`${c.label}: its position reading is ${(s.ageS / 60).toFixed(1)} min old`);
    }
    if (!poolKnown) bad.push(`the pool: no fresh, good reading from ${poolChannels.join(' or ')}`);
    if (!bad.length)
      return {
        code: 'telemetry-stale',
        ok: true,
        message: 'gate positions and the pool are fresh',
      };
    return {
      code: 'telemetry-stale',
      ok: false,
      message: `Telemetry is stale or missing for ${bad.join('; ')}. Restore the gate controller's or gauge's link (or check the instrument) before operating.`,
    };
  }

  private atRest(
    order: Order,
    controls: readonly OrderControl[],
    busy: ReadonlyMap<string, number>,
    now: number,
  ): Outcome {
    const bad: string[] = [];
    for (const c of controls) {
      const other = busy.get(c.id);
      if (other !== undefined && other !== order.id) {
        bad.push(`${c.label} is being moved by order ${other}`);
        continue;
      }
      const m = this.positions.movement(order.reservoirId, c.channel, c.unit, now);
      if (m)
        bad.push(
          `${c.label} is moving (${fmt(m.from, c.unit)} to ${fmt(m.to, c.unit)} in its last reports)`,
        );
    }
    return bad.length
      ? {
          code: 'gate-moving',
          ok: false,
          message: `${bad.join('; ')}. Wait until it has stopped (or its order is closed), then execute again.`,
        }
      : { code: 'gate-moving', ok: true, message: 'no gate of this step is moving' };
  }
}
