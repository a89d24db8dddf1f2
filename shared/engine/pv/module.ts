/**
 * PV array output at the battery: temperature-corrected DC power, system losses, controller, current cap.
 */

/**
 * Cell temperature from the NOCT (Ross) model: T_c = T_a + (NOCT − 20)/800 · G_poa.
 * @see R. G. Ross, "Flat-plate photovoltaic array design optimization", 14th IEEE PVSC, 1980;
 *      pvlib `temperature.ross` (NOCT form).
 * @returns [°C]
 */
export function cellTempNoctC(poaWPerM2: number, ambientC: number, noctC: number): number {
  return ambientC + ((noctC - 20) / 800) * poaWPerM2
}

/**
 * DC power of an array with a linear power temperature coefficient (PVWatts DC model):
 *   P = P_stc · G_poa / 1000 · (1 + γ (T_c − 25)).
 * @param gammaPerC - γ, e.g. −0.0037 [1/°C]
 * @returns [W]
 * @see A. P. Dobos, "PVWatts Version 5 Manual", NREL/TP-6A20-62641, 2014; pvlib `pvsystem.pvwatts_dc`.
 */
export function pvwattsDcW(
  poaWPerM2: number,
  cellTempC: number,
  peakPowerWp: number,
  gammaPerC: number,
): number {
  return Math.max(0, (peakPowerWp * poaWPerM2 * (1 + gammaPerC * (cellTempC - 25))) / 1000)
}

/**
 * Share of the array's maximum-power output that reaches the battery through the controller.
 * MPPT: 0.96 (conversion 95–98 %, common practice, no source).
 * PWM: 0.80 — a PWM controller clamps the array to battery voltage, about 79 % of P_mp for a 36-cell
 * module on a 12 V battery (REFERENCES §4 reasoning; common practice, no source).
 */
export const CONTROLLER_FACTOR = { mppt: 0.96, pwm: 0.8 } as const satisfies Record<string, number>
