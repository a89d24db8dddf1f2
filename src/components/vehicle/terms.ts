/** Trade terms used on the vehicle and scenario screens, explained once each (shown by TermTip). */
export const TERMS = {
  series:
    'Cells joined plus to minus add their voltages: 4 LFP cells of 3.2 V in series make a 12.8 V bank. Written as "4S".',
  parallel:
    'Strings joined side by side add their amp-hours at the same voltage: two 280 Ah strings make 560 Ah. Written as "2P".',
  soc: 'State of charge: how full the bank is, from 0 % (empty) to 100 % (full).',
  socFloor:
    'The lowest state of charge you allow. Loads that would take the bank lower are counted as energy you ran short of. LFP banks are often used down to 10 %; lead-acid to 50 % for a long life.',
  socCeiling:
    'The state of charge the chargers stop at. Some people stop LFP at 90 % to go easier on the cells.',
  roundTrip:
    'Of the energy you put into the bank, the share you get back out. LFP about 95 %, lead-acid 80–85 %.',
  peukert:
    'Lead-acid batteries deliver fewer amp-hours when drained fast. The Peukert exponent says how much: 1 means no effect, 1.1–1.3 is usual for lead-acid.',
  bms: 'Battery management system: the electronics that watch each cell and cut charging or loads off when a limit is reached. It draws a little power all the time.',
  cRate:
    'Current as a multiple of capacity: 0.5C on a 280 Ah bank is 140 A. Cell makers give the limits in C.',
  mppt: 'Maximum power point tracking: a solar controller that converts the panel voltage down efficiently. PWM controllers are simpler and waste more when the panel voltage is well above the battery.',
  wp: 'Watt-peak: what a panel delivers in full sun on a cool day (1000 W/m², 25 °C). Real output is usually well below.',
  dcdc: 'A DC-DC charger takes power from the vehicle’s alternator while the engine runs and charges the house bank with the right profile.',
  shore: 'Shore power: a mains hook-up at a campsite, marina or home, feeding a battery charger.',
  dutyCycle:
    'The share of its on-time an appliance really draws its full power. A fridge compressor that runs 15 minutes in every hour has a duty cycle of 0.25.',
  standby: 'Power drawn while switched off but still plugged in or waiting for a remote.',
  inverter:
    'Turns the bank’s DC into mains-voltage AC for appliances with a plug. It loses some energy doing so and draws a little even with nothing plugged in.',
  heater:
    'LFP cells must not be charged below about 0 °C. A heater pad with a thermostat keeps the cells warm enough, at the cost of some energy on cold nights.',
  clearness:
    'How much of the sunshine reaching the top of the atmosphere gets to the ground: about 0.7 on a clear day, 0.2 under heavy cloud.',
  hookup: 'Plugged into shore power for the day: the mains charger runs.',
} as const
