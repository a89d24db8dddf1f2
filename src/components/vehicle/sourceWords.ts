import type { ChargeSourceCreate, ChargeSourceKind } from '@shared/schemas/vehicles'

export const SOURCE_KINDS: Record<ChargeSourceKind, { label: string; icon: string; blurb: string }> = {
  solar: { label: 'Solar panels', icon: 'wb_sunny', blurb: 'Panels on the roof through a charge controller' },
  dcdc: { label: 'DC-DC charger', icon: 'local_shipping', blurb: 'From the alternator while you drive' },
  shore: { label: 'Shore charger', icon: 'power', blurb: 'From mains power at a hook-up' },
  generator: {
    label: 'Generator charger',
    icon: 'local_gas_station',
    blurb: 'From a generator while it runs',
  },
}

/** A new source of a kind, with typical starting values (common practice, no source). */
export function newSource(kind: ChargeSourceKind): ChargeSourceCreate {
  switch (kind) {
    case 'solar':
      return { kind, name: 'Roof panels', peakPowerWp: 400, tiltDeg: 0, controller: 'mppt', maxCurrentA: 30 }
    case 'dcdc':
      return { kind, name: 'DC-DC charger', currentA: 30 }
    case 'shore':
      return { kind, name: 'Shore charger', currentA: 20 }
    case 'generator':
      return { kind, name: 'Generator charger', currentA: 20 }
  }
}

/** One line of figures for a source's card. */
export function sourceSummary(s: ChargeSourceCreate): string {
  switch (s.kind) {
    case 'solar':
      return `${s.peakPowerWp} Wp · ${s.controller.toUpperCase()} ${s.maxCurrentA} A · tilt ${s.tiltDeg ?? 0}°`
    case 'dcdc':
      return `${s.currentA} A while driving`
    case 'shore':
      return `${s.currentA} A while hooked up`
    case 'generator':
      return `${s.currentA} A while running${s.fuelLPerH ? ` · ${s.fuelLPerH} L/h` : ''}`
  }
}
