/**
 * Peukert's law for lead-acid discharge: t = H · (C / (I·H))^k, with C the capacity rated at the H-hour rate.
 * Equivalently the pack loses charge as if the current were I_eff = I · (I / I_H)^(k−1), I_H = C / H.
 * @see W. Peukert, "Über die Abhängigkeit der Kapazität von der Entladestromstärke bei Bleiakkumulatoren",
 *      Elektrotechnische Zeitschrift 20:20–21, 1897; form as in Doerffel & Sharkh,
 *      J. Power Sources 155:395–400, 2006 (from memory).
 */

/** Hours to empty a full pack at constant current I. [h] */
export function peukertRuntimeH(
  capacityAh: number,
  ratedHours: number,
  currentA: number,
  exponent: number,
): number {
  return ratedHours * Math.pow(capacityAh / (currentA * ratedHours), exponent)
}

/**
 * Factor by which charge leaves the pack faster than the current says: (I / I_H)^(k−1).
 * Not applied below the rated current (factor floored at 1): extrapolating Peukert to small currents
 * promises capacity above rating, which self-discharge and ageing eat in practice (common practice, no source).
 */
export function peukertFactor(
  capacityAh: number,
  ratedHours: number,
  currentA: number,
  exponent: number,
): number {
  if (exponent === 1 || currentA <= 0) return 1
  const ratedCurrentA = capacityAh / ratedHours
  return currentA <= ratedCurrentA ? 1 : Math.pow(currentA / ratedCurrentA, exponent - 1)
}

/** Exponent k from two constant-current tests: k = ln(t2/t1) / ln(I1/I2). */
export function peukertExponentFromTests(
  current1A: number,
  hours1: number,
  current2A: number,
  hours2: number,
): number {
  return Math.log(hours2 / hours1) / Math.log(current1A / current2A)
}
