/**
 * Tailwater below the dam from the total outflow. The rating is invented for the demo (no survey
 * behind it): stage = riverbed + offset + coefficient * Q^exponent, which gives about 3 m of water
 * at the base flow and about 15 m at the design flood, the shape of a narrow rock valley.
 */
export const TAILWATER_RATING = { offset: 0.6, coefficient: 0.55, exponent: 0.43 } as const;

export function tailwaterElevation(riverbedElevation: number, outflow: number): number {
  const q = Math.max(0, outflow);
  return (
    riverbedElevation +
    TAILWATER_RATING.offset +
    TAILWATER_RATING.coefficient * q ** TAILWATER_RATING.exponent
  );
}
