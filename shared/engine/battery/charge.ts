/**
 * Charge acceptance and efficiency of the pack.
 */

/**
 * Lead-acid charge acceptance tapers near full (absorption phase): the allowed charge power falls
 * linearly from the full limit at `taperStartSoc` to zero at the ceiling. Common practice, no source
 * (a straight-line stand-in for the constant-voltage phase). taperStartSoc ≥ ceiling means no taper.
 * @returns multiplier on the charge power limit [0–1]
 */
export function chargeTaperFactor(
  socFraction: number,
  taperStartSocFraction: number,
  socCeilingFraction: number,
): number {
  if (taperStartSocFraction >= socCeilingFraction || socFraction <= taperStartSocFraction) return 1
  return Math.max(0, (socCeilingFraction - socFraction) / (socCeilingFraction - taperStartSocFraction))
}

/**
 * One-way efficiency when the round-trip efficiency is split evenly between charge and discharge:
 * η_charge = η_discharge = √η_roundTrip. Energy balance; no empirical model.
 */
export function oneWayEfficiency(roundTripEfficiencyFraction: number): number {
  return Math.sqrt(roundTripEfficiencyFraction)
}

/** Nominal cell count × cell voltage: 4 LFP cells of 3.2 V give 12.8 V. [V] */
export function packNominalVoltageV(cellsSeries: number, cellNominalV: number): number {
  return cellsSeries * cellNominalV
}
