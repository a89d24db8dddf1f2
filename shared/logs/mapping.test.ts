import { describe, expect, it } from 'vitest'
import { detectShape } from './detect'
import { completeMapping, proposeMapping } from './mapping'

const bms = [
  'Time,Pack voltage (V),Current (A),SOC (%),Battery temp (°C),Cabin temp (°C),Cell 1 (mV),Cell 2 (mV),Cell 3 (mV),Cell 4 (mV)',
  '2026-01-12 08:00:00,13.210,-3.10,80.0,8.1,5.0,3302,3303,3301,3305',
  '2026-01-12 08:01:00,13.250,5.20,80.1,8.1,5.0,3312,3313,3311,3315',
  '2026-01-12 08:02:00,13.290,9.80,80.3,8.2,5.1,3322,3323,3321,3325',
  '2026-01-12 08:03:00,13.200,-4.00,80.2,8.2,5.1,3300,3301,3299,3303',
  '2026-01-12 08:04:00,13.300,10.0,80.4,8.2,5.1,3325,3326,3324,3327',
].join('\n')

describe('proposeMapping', () => {
  it('maps a typical BMS export by its header names, with cells in millivolts', () => {
    const p = proposeMapping(detectShape(bms, true)!)
    expect(p.missing).toEqual([])
    expect(p.mapping).toMatchObject({
      timestampColumn: 'Time',
      timestampFormat: 'ymd',
      packVoltageColumn: 'Pack voltage (V)',
      packVoltageUnit: 'V',
      currentColumn: 'Current (A)',
      currentUnit: 'A',
      currentSign: 'charge-positive',
      socColumn: 'SOC (%)',
      socUnit: 'percent',
      temperatureColumns: ['Battery temp (°C)', 'Cabin temp (°C)'],
      cellVoltageColumns: ['Cell 1 (mV)', 'Cell 2 (mV)', 'Cell 3 (mV)', 'Cell 4 (mV)'],
      cellVoltageUnit: 'mV',
    })
    expect(completeMapping(p.mapping).ok).toBe(true)
  })

  it('sees a discharge-positive current from SOC falling while current is positive', () => {
    const text = [
      'timestamp;voltage_mV;current;soc',
      '12/01/2026 08:00;13210;3,1;0,80',
      '12/01/2026 08:01;13200;3,0;0,79',
      '12/01/2026 08:02;13300;-5,0;0,80',
      '12/01/2026 08:03;13190;3,2;0,79',
      '12/01/2026 08:04;13310;-6,0;0,80',
    ].join('\n')
    const p = proposeMapping(detectShape(text, true)!)
    expect(p.mapping.currentSign).toBe('discharge-positive')
    expect(p.mapping.packVoltageUnit).toBe('mV')
    expect(p.mapping.socUnit).toBe('fraction')
    expect(p.mapping.timestampFormat).toBe('dmy')
    expect(p.mapping.format.decimalSeparator).toBe(',')
  })

  it('asks for what it cannot find', () => {
    const p = proposeMapping(detectShape('a,b\n1,2\n3,4', true)!)
    expect(p.missing.length).toBeGreaterThanOrEqual(2)
    expect(completeMapping(p.mapping).ok).toBe(false)
  })

  it('reuses the vehicle’s remembered mapping when its columns are all there', () => {
    const first = proposeMapping(detectShape(bms, true)!).mapping
    const remembered = completeMapping({ ...first, currentSign: 'discharge-positive', utcOffsetMinutes: 60 })
    if (!remembered.ok) throw new Error('mapping should be complete')
    const again = proposeMapping(detectShape(bms, true)!, remembered.mapping)
    expect(again.mapping.currentSign).toBe('discharge-positive')
    expect(again.mapping.utcOffsetMinutes).toBe(60)
  })
})
