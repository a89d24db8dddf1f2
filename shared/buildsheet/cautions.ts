/**
 * Safety cautions shown on the sheet, each placed next to the item it concerns (`near`).
 */
import type { Chemistry } from '../schemas/plan.ts'

export type CautionPlace = 'top' | 'protection' | 'heater' | 'ratings' | 'cables' | 'diagram'

export interface Caution {
  id: string
  near: CautionPlace
  title: string
  text: string
}

export function buildCautions(chemistry: Chemistry, hasHeater: boolean): Caution[] {
  const out: Caution[] = [
    {
      id: 'fire',
      near: 'top',
      title: 'High-current DC can start fires',
      text: 'A short across a pack like this can pass thousands of amps, melt tools and set cables alight. Work with the main fuse out, insulate tools, and never leave a bare cable end near a terminal.',
    },
    {
      id: 'codes',
      near: 'top',
      title: 'Follow local codes; have the work checked',
      text: 'This sheet helps you plan. It does not replace the rules where you live or sail, or a licensed installer who checks the finished system before it is used.',
    },
    {
      id: 'fuse-close',
      near: 'ratings',
      title: 'Fuse close to the battery',
      text: 'The main fuse goes on the pack positive, as close to the terminal as you can (boat rules ask for about 18 cm / 7 in — ABYC E-11, from memory). Every cable must be protected by a fuse no larger than the cable can carry.',
    },
    {
      id: 'cable-heat',
      near: 'cables',
      title: 'Undersized cable gets hot',
      text: 'Use the size on the sheet or larger, with crimped lugs made with the proper tool. Route cables away from sharp edges and exhaust heat, and secure them.',
    },
  ]
  if (chemistry === 'lfp') {
    out.push({
      id: 'lithium',
      near: 'protection',
      title: 'Lithium cells can fail violently',
      text: 'Overcharged, over-discharged, crushed or charged below freezing, a lithium cell can vent, burn or split. The BMS rules below are what keeps the cells inside their limits: set every one and test it.',
    })
  } else {
    out.push({
      id: 'lead-acid-gas',
      near: 'protection',
      title: 'Lead-acid batteries give off hydrogen',
      text: 'Charging makes explosive gas, more so when overcharged. Ventilate the battery space and keep sparks away; never charge a frozen battery.',
    })
  }
  if (hasHeater) {
    out.push({
      id: 'heater',
      near: 'heater',
      title: 'Heater pad: fuse it and limit its temperature',
      text: 'A pad stuck on can overheat the cells. Fuse its feed, keep the thermostat sensor on the cells, and use a pad with its own over-temperature cut-out.',
    })
  }
  return out
}
