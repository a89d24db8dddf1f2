/**
 * The verdict's reserve: how far above the floor the lowest charge must stay for a plain "carries".
 */

/**
 * Margin (SOC points above the floor at the lowest point) below which a carried trip is called tight:
 * a tenth of the pack kept back for a colder night or a duller day than planned. Common practice, no source.
 */
export const TIGHT_MARGIN_FRACTION = 0.1
