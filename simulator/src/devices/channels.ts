import { vNotchHead } from '@stillwell/shared/hydraulics';
import type { ChannelDefinition, ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { PlantState } from '../plant/reservoir-plant.js';
import { gaussian, type Random } from '../plant/rng.js';

/** How a channel's instrument reads the plant, and how it errs. */
export interface ChannelReader {
  channel: ChannelDefinition;
  /** the true value in the plant */
  read(state: Readonly<PlantState>): number;
  /** what the instrument reports for a true value */
  measure(value: number, random: Random): number;
}

interface GaugeError {
  /** fixed offset of this instrument, in the channel unit */
  offset: number;
  /** random error, standard deviation in the channel unit */
  sigma: number;
  /** random error as a fraction of the value */
  relative: number;
  /** reporting resolution, decimal places */
  decimals: number;
}

const NONE: GaugeError = { offset: 0, sigma: 0, relative: 0, decimals: 3 };

/** Instrument errors by role: pool gauges about 1-2 cm, flows a few percent, encoders exact to 1 mm. */
const ERRORS: Record<ChannelDefinition['role'], GaugeError> = {
  pool: { offset: 0, sigma: 0.012, relative: 0, decimals: 3 },
  inflow: { offset: 0, sigma: 0, relative: 0.03, decimals: 1 },
  outflow: { offset: 0, sigma: 0, relative: 0.025, decimals: 1 },
  rain: { offset: 0, sigma: 0, relative: 0.05, decimals: 1 },
  tailwater: { offset: 0, sigma: 0.02, relative: 0, decimals: 3 },
  'gate-opening': { ...NONE, decimals: 3 },
  'valve-opening': { ...NONE, decimals: 1 },
  // a float or pressure transducer in the weir pool: half a millimetre, read to a tenth
  'seepage-weir-head': { offset: 0, sigma: 0.0005, relative: 0, decimals: 4 },
  // vibrating-wire piezometers: about a centimetre of water
  piezometer: { offset: 0, sigma: 0.01, relative: 0, decimals: 3 },
};

/** Each pool gauge is set up slightly differently, so two gauges never agree exactly. */
const POOL_GAUGE_OFFSETS = [0.012, -0.008, 0.005, -0.015];

const round = (v: number, decimals: number) => Number(v.toFixed(decimals));

function sourceOf(reservoir: ReservoirDefinition, c: ChannelDefinition) {
  switch (c.role) {
    case 'pool':
      return (s: Readonly<PlantState>) => s.pool;
    case 'inflow':
      return (s: Readonly<PlantState>) => s.inflow;
    case 'outflow':
      return (s: Readonly<PlantState>) => s.outflow;
    case 'rain':
      return (s: Readonly<PlantState>) => s.rain;
    case 'tailwater':
      return (s: Readonly<PlantState>) => s.tailwater;
    case 'gate-opening':
      for (const st of reservoir.structures) {
        if (st.kind !== 'gated-spillway') continue;
        const gate = st.gates.find((g) => g.channel === c.id);
        if (gate) return (s: Readonly<PlantState>) => s.settings.gates[gate.id] ?? 0;
      }
      break;
    case 'valve-opening':
      for (const st of reservoir.structures) {
        if (st.kind === 'low-level-outlet' && st.valveChannel === c.id) {
          return (s: Readonly<PlantState>) => s.settings.valves[st.id] ?? 0;
        }
      }
      break;
    case 'seepage-weir-head': {
      const weir = reservoir.seepageWeirs?.find((w) => w.channel === c.id);
      if (!weir) break;
      const notch = {
        angleDeg: weir.notchAngleDeg,
        dischargeCoefficient: weir.dischargeCoefficient,
        headCorrection: weir.headCorrection,
      };
      // the weir reports the head its flow makes over the notch
      return (s: Readonly<PlantState>) => vNotchHead(s.instruments.seepage[weir.id] ?? 0, notch);
    }
    case 'piezometer': {
      const p = reservoir.piezometers?.find((x) => x.channel === c.id);
      if (p) return (s: Readonly<PlantState>) => s.instruments.piezometers[p.id] ?? 0;
      break;
    }
  }
  throw new RangeError(`channel "${c.id}" (${c.role}) matches nothing in the plant`);
}

export function channelReaders(reservoir: ReservoirDefinition): ChannelReader[] {
  return reservoir.channels.map((channel) => {
    const base = ERRORS[channel.role];
    const poolIndex = reservoir.poolChannels.indexOf(channel.id);
    const offset =
      poolIndex >= 0 ? (POOL_GAUGE_OFFSETS[poolIndex % POOL_GAUGE_OFFSETS.length] ?? 0) : 0;
    const error: GaugeError = { ...base, offset: base.offset + offset };
    return {
      channel,
      read: sourceOf(reservoir, channel),
      measure(value, random) {
        const noise = error.sigma + error.relative * Math.abs(value);
        const measured = value + error.offset + (noise > 0 ? noise * gaussian(random) : 0);
        // A real instrument saturates at the ends of its range; flows and rain are never negative.
        const clamped = Math.min(channel.max, Math.max(channel.min, measured));
        return round(clamped, error.decimals);
      },
    };
  });
}
