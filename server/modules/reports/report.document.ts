/**
 * The PDF report's layout (pdfmake document definition), built from plain data: the plan, the engine's
 * analysis JSON, the build sheet and the advisor's comments. Pure apart from the fonts' file paths; the
 * service gathers the data and renders. Our own layout: a cover with the answer first, then the figures,
 * charts, daily table, equipment, build sheet with its cautions, and the advisor's notes.
 */
import type { Analysis, Jsonified, Plan } from '../../../shared/engine/index'
import { tripMoment } from '../../../shared/engine/results'
import { TIGHT_MARGIN_FRACTION } from '../../../shared/engine/margin'
import type { BuildSheet } from '../../../shared/buildsheet/index'
import { dailyEnergySvg, socChartSvg, SERIES_COLOURS, SOURCE_LABELS } from './charts'

type Results = Jsonified<Analysis>
type Sheet = Jsonified<BuildSheet>
type Node = Record<string, unknown> | string
type Cell = Record<string, unknown> | string

export interface ReportComment {
  author: string
  at: string
  pinLabel: string | null
  body: string
}

export interface ReportReview {
  advisorName: string
  state: string
  verdictLabel: string | null
  summary: string | null
  comments: ReportComment[]
}

export interface ReportInput {
  vehicle: { name: string; kind: string; systemVoltageV: number }
  scenario: { name: string; placeName: string; notes: string }
  plan: Plan
  results: Results
  sheet: Sheet | null
  sheetMissing: string[]
  reviews: ReportReview[]
  generatedAt: Date
}

const COLOURS = {
  spruce: '#1F5E5B',
  slate: '#3D5A80',
  copper: '#C8752E',
  paper: '#F7F5F0',
  line: '#E2DED5',
  positive: '#2E7D4F',
  warning: '#B7791F',
  negative: '#B23A3A',
  muted: '#5F6B6A',
}

const MINUS = '\u2212'
const num = (x: number | null | undefined, digits = 0): string => {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—'
  const s = x.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })
  return s.replace(/^-/, MINUS)
}
const pct = (x: number | null | undefined) => (x === null || x === undefined ? '—' : `${num(x * 100)} %`)
const energy = (wh: number | null | undefined) =>
  wh === null || wh === undefined ? '—' : Math.abs(wh) >= 1000 ? `${num(wh / 1000, 2)} kWh` : `${num(wh)} Wh`
const tempC = (c: number | null | undefined) => `${num(c, 0)} °C`
/** Clock times name the end of an hour of the run, as on the Outlook (shared/engine/results.ts). */
const moment = tripMoment

const CATEGORY_LABELS: Record<string, string> = {
  fridge: 'Fridge',
  lighting: 'Lighting',
  cooking: 'Cooking',
  heating: 'Heating',
  electronics: 'Electronics',
  water: 'Water',
  ventilation: 'Ventilation',
  other: 'Other',
  inverter: 'Inverter idle',
  bms: 'BMS',
  heater: 'Heater pad',
}
const CHEMISTRY_LABELS: Record<string, string> = {
  lfp: 'Lithium iron phosphate (LFP)',
  agm: 'AGM lead-acid',
  gel: 'Gel lead-acid',
  flooded: 'Flooded lead-acid',
}
const SKY_LABELS: Record<string, string> = {
  clear: 'clear',
  mixed: 'mixed',
  overcast: 'overcast',
  custom: 'custom clearness',
}

/** The one-line answer, in the words the Outlook page uses. */
export function verdictHeadline(r: Results): {
  headline: string
  detail: string
  tone: 'positive' | 'warning' | 'negative'
} {
  const s = r.summary
  const floor = r.plan.battery.socFloorFraction
  const lowest = s.lowestSocHour >= 0 ? ` on ${moment(s.lowestSocHour)}` : ''
  const detail = `Lowest charge ${pct(s.lowestSocFraction)}${lowest}; the floor is ${pct(floor)}.`
  if (r.verdict.status === 'short') {
    const first = r.totals.firstShortageHour
    return {
      headline: first >= 0 ? `Runs short on ${moment(first)}` : 'Cannot serve every load on this trip',
      detail: `${detail} ${energy(s.unservedWh)} of loads would go unserved.`,
      tone: 'negative',
    }
  }
  const m = pct(r.verdict.marginFraction)
  if (r.verdict.status === 'tight')
    return { headline: `Carries the trip, but only ${m} to spare`, detail, tone: 'warning' }
  return { headline: `Carries the trip with ${m} to spare`, detail, tone: 'positive' }
}

function heading(text: string, pageBreak = false): Node {
  return { text, style: 'h2', ...(pageBreak ? { pageBreak: 'before' } : {}) }
}

function table(
  header: string[],
  rows: Cell[][],
  widths: (string | number)[],
  opts: { numeric?: number[] } = {},
): Node {
  const numeric = new Set(opts.numeric ?? [])
  return {
    table: {
      headerRows: 1,
      widths,
      dontBreakRows: true,
      body: [
        header.map((h, i) => ({ text: h, style: 'th', alignment: numeric.has(i) ? 'right' : 'left' })),
        ...rows.map((r) =>
          r.map((c, i) =>
            typeof c === 'string' ? { text: c, alignment: numeric.has(i) ? 'right' : 'left' } : c,
          ),
        ),
      ],
    },
    layout: {
      hLineWidth: (i: number) => (i <= 1 ? 0.8 : 0.4),
      vLineWidth: () => 0,
      hLineColor: () => COLOURS.line,
      fillColor: (i: number) => (i === 0 ? COLOURS.paper : null),
      paddingTop: () => 2.5,
      paddingBottom: () => 2.5,
    },
    style: 'table',
  }
}

function figure(label: string, value: string, note = ''): Node {
  return {
    stack: [
      { text: label, style: 'figLabel' },
      { text: value, style: 'figValue' },
      ...(note ? [{ text: note, style: 'figNote' }] : []),
    ],
    margin: [0, 0, 0, 8],
  }
}

function caution(title: string, text: string): Node {
  return {
    table: {
      widths: ['*'],
      body: [
        [
          {
            stack: [
              { text: `Caution: ${title}`, bold: true, color: COLOURS.warning },
              { text, fontSize: 8.5 },
            ],
            margin: [6, 4, 6, 4],
          },
        ],
      ],
    },
    layout: {
      hLineWidth: () => 0.8,
      vLineWidth: (i: number) => (i === 0 ? 3 : 0.8),
      hLineColor: () => COLOURS.warning,
      vLineColor: () => COLOURS.warning,
      fillColor: () => '#FBF3E6',
    },
    margin: [0, 3, 0, 3],
    unbreakable: true,
  }
}

/** Characters Nunito 3 has no glyph for, and what the report prints instead. */
const GLYPH_FALLBACKS: [RegExp, string][] = [
  [/[→⇒]/g, '›'],
  [/ρ/g, 'rho'],
  [/α/g, 'alpha'],
  [/⁻/g, '-'],
  [/✓/g, 'yes'],
]

/** Replace characters the shipped font cannot draw, in every string of the definition except SVG text. */
export function withFontFallbacks<T>(node: T, key = ''): T {
  if (typeof node === 'string')
    return (
      key === 'svg' ? node : GLYPH_FALLBACKS.reduce((t, [re, to]) => t.replace(re, to), node as string)
    ) as T
  if (Array.isArray(node)) return node.map((n) => withFontFallbacks(n)) as T
  if (node && typeof node === 'object' && Object.getPrototypeOf(node) === Object.prototype) {
    const out: Record<string, unknown> = {}
    for (const [k, v] of Object.entries(node)) out[k] = withFontFallbacks(v, k)
    return out as T
  }
  return node
}

export function buildReportDocument(input: ReportInput): Record<string, unknown> {
  const { results: r, plan, vehicle, scenario } = input
  const b = r.plan.battery
  const trip = plan.trip
  const v = verdictHeadline(r)
  const toneColour = COLOURS[v.tone]
  const s = r.summary
  const totalIn = Object.values(s.energyInWh).reduce((a, x) => a + x, 0)
  const days = r.days
  const width = 515

  // ---- cover ----------------------------------------------------------------------------------
  const place = scenario.placeName || `${num(trip.latitudeDeg, 2)}°, ${num(trip.longitudeDeg, 2)}°`
  const cover: Node[] = [
    {
      columns: [
        {
          svg: `<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40" viewBox="0 0 40 40"><rect width="40" height="40" rx="8" fill="${COLOURS.spruce}"/><text x="20" y="29" font-family="Nunito" font-size="26" font-weight="bold" fill="#FFFFFF" text-anchor="middle">\u03A9</text></svg>`,
          width: 40,
          font: 'Nunito',
        },
        {
          stack: [
            { text: 'Ohmward', style: 'brand' },
            { text: 'Plan report', color: COLOURS.muted },
          ],
          margin: [10, 2, 0, 0],
        },
      ],
      margin: [0, 0, 0, 24],
    },
    { text: vehicle.name, style: 'h1' },
    { text: scenario.name, style: 'subtitle' },
    {
      text: `${trip.days} day${trip.days === 1 ? '' : 's'} from ${trip.startDate} · ${place} · ${SKY_LABELS[trip.sky] ?? trip.sky} sky · nights ${tempC(trip.nightLowC)}, days ${tempC(trip.dayHighC)}`,
      color: COLOURS.muted,
      margin: [0, 2, 0, 16],
    },
    {
      table: {
        widths: ['*'],
        body: [
          [
            {
              stack: [
                { text: 'Verdict', fontSize: 9, color: COLOURS.muted },
                { text: v.headline, fontSize: 18, bold: true, color: toneColour, margin: [0, 2, 0, 4] },
                { text: v.detail },
                { text: r.verdict.message, fontSize: 8.5, color: COLOURS.muted, margin: [0, 4, 0, 0] },
              ],
              margin: [10, 8, 10, 8],
            },
          ],
        ],
      },
      layout: {
        hLineWidth: () => 1,
        vLineWidth: (i: number) => (i === 0 ? 5 : 1),
        hLineColor: () => toneColour,
        vLineColor: () => toneColour,
        fillColor: () => '#FFFFFF',
      },
      margin: [0, 0, 0, 16],
    },
    { text: 'Key figures', style: 'h3' },
    {
      columns: [
        {
          stack: [
            figure(
              'Lowest state of charge',
              pct(s.lowestSocFraction),
              s.lowestSocHour >= 0 ? `on ${moment(s.lowestSocHour)}` : '',
            ),
            figure(
              'State of charge at the end',
              pct(s.finalSocFraction),
              `started at ${pct(s.startSocFraction)}`,
            ),
            figure('Days ending below the floor', num(s.daysEndingBelowFloor)),
            figure('Loads not served', energy(s.unservedWh)),
          ],
        },
        {
          stack: [
            figure(
              'Days of autonomy',
              r.autonomy.days === null
                ? `more than ${num(r.autonomy.horizonDays)} days`
                : `${num(r.autonomy.days, 1)} days`,
              'from full to the floor with no charging',
            ),
            figure(
              'Pack needed',
              r.packNeeded.capacityAh === null ? 'not reachable' : `${num(r.packNeeded.capacityAh)} Ah`,
              `the bare minimum (charge just touches the floor); ${
                r.packNeeded.withMarginCapacityAh === null
                  ? ''
                  : `${num(r.packNeeded.withMarginCapacityAh)} Ah with ${pct(TIGHT_MARGIN_FRACTION)} to spare; `
              }this pack: ${num(b.capacityAh)} Ah`,
            ),
            figure(
              'Solar needed',
              r.solarNeeded.peakPowerWp === null ? 'not reachable' : `${num(r.solarNeeded.peakPowerWp)} Wp`,
              `no load shed, and the pack back to full on the last day or no lower than it started${
                r.solarNeeded.ownPackReason
                  ? `; for a pack of ${num(r.solarNeeded.capacityAh)} Ah (Pack needed)`
                  : ''
              }`,
            ),
            figure(
              'Classic sizing method',
              `${num(r.classicSizing.capacityAh)} Ah`,
              'load × days ÷ allowed depth of discharge',
            ),
          ],
        },
        {
          stack: [
            figure('Energy in', energy(totalIn), 'from all charge sources'),
            figure('Energy out', energy(s.energyOutWh), 'loads, heater and losses served'),
            figure('Heater pad', energy(s.heaterWh)),
            figure(
              'Charging blocked by cold',
              `${num(s.chargeBlockedColdH)} h`,
              energy(s.chargeBlockedWh) + ' lost',
            ),
            figure('Equivalent full cycles', num(s.equivalentFullCycles, 2)),
          ],
        },
      ],
      columnGap: 12,
    },
    { text: 'The battery bank', style: 'h3', margin: [0, 8, 0, 4] },
    {
      text: `${CHEMISTRY_LABELS[b.chemistry] ?? b.chemistry}, ${b.cellsSeries}S${b.cellsParallel}P, ${num(b.capacityAh)} Ah at ${num(b.nominalVoltageV, 1)} V (${energy(b.capacityAh * b.nominalVoltageV)}); usable window ${pct(b.socFloorFraction)} to ${pct(b.socCeilingFraction)}; charging allowed ${tempC(b.chargeMinC)} to ${tempC(b.chargeMaxC)}${b.heater ? `; heater pad ${num(b.heater.powerW)} W, on below ${tempC(b.heater.onBelowC)}, off above ${tempC(b.heater.offAboveC)}` : '; no heater pad'}.`,
    },
    {
      text: `Computed hour by hour by Ohmward's engine: sun position, clear-sky irradiance scaled by the sky choice, panel temperature, driving and hook-up hours from the day plan, each appliance over its window, the pack's temperature and charge limits. A plan, not a guarantee: weather and use differ.`,
      fontSize: 8,
      color: COLOURS.muted,
      margin: [0, 10, 0, 0],
    },
  ]

  // ---- charts ---------------------------------------------------------------------------------
  const loadCats = [
    'fridge',
    'lighting',
    'cooking',
    'heating',
    'electronics',
    'water',
    'ventilation',
    'other',
    'inverter',
    'bms',
  ] as const
  const charts: Node[] = [
    heading('Charts', true),
    { text: 'State of charge, hour by hour', style: 'h3' },
    {
      svg: socChartSvg({
        socEndFraction: r.series.socEndFraction,
        sunElevationDeg: r.series.sunElevationDeg,
        floorFraction: b.socFloorFraction,
        width,
        height: 220,
      }),
      width,
      font: 'Nunito',
    },
    { text: 'Energy in and out, day by day', style: 'h3', margin: [0, 14, 0, 4] },
    {
      svg: dailyEnergySvg({
        days: days.map((d) => ({
          inWh: d.inWh,
          loadsWh: loadCats.reduce((a, c) => a + (d.outWh[c] ?? 0), 0),
          heaterWh: d.heaterWh,
        })),
        width,
        height: 220,
      }),
      width,
      font: 'Nunito',
    },
    {
      text: 'Left bar of each day: energy in by source. Right bar: energy out to loads and to the heater pad.',
      fontSize: 8,
      color: COLOURS.muted,
    },
    { text: 'Where the energy came from', style: 'h3', margin: [0, 14, 0, 4] },
    table(
      ['Source', 'Energy in', 'Share'],
      (['solar', 'dcdc', 'shore', 'generator'] as const).map((k) => [
        {
          columns: [
            { canvas: [{ type: 'rect', x: 0, y: 2, w: 7, h: 7, color: SERIES_COLOURS[k] }], width: 12 },
            { text: SOURCE_LABELS[k] },
          ],
        },
        energy(s.energyInWh[k]),
        pct(s.sourceShareFraction[k]),
      ]),
      ['*', 90, 60],
      { numeric: [1, 2] },
    ),
  ]

  // ---- daily table ----------------------------------------------------------------------------
  const daily: Node[] = [
    heading('Day by day', true),
    table(
      [
        'Day',
        'Date',
        'Solar',
        'Alternator',
        'Shore',
        'Generator',
        'Loads',
        'Heater',
        'Lowest SOC',
        'End SOC',
        'Cold h',
        'Not served',
      ],
      days.map((d) => [
        String(d.day + 1),
        d.date,
        energy(d.inWh.solar),
        energy(d.inWh.dcdc),
        energy(d.inWh.shore),
        energy(d.inWh.generator),
        energy(loadCats.reduce((a, c) => a + (d.outWh[c] ?? 0), 0)),
        energy(d.heaterWh),
        pct(d.lowestSocFraction),
        pct(d.finalSocFraction),
        num(d.chargeBlockedColdH),
        energy(d.unservedWh),
      ]),
      [20, 50, '*', '*', '*', '*', '*', '*', 36, 34, 26, '*'],
      { numeric: [2, 3, 4, 5, 6, 7, 8, 9, 10, 11] },
    ),
  ]

  // ---- equipment ------------------------------------------------------------------------------
  const appRows = plan.appliances.map((a) => {
    const u = a.usage ?? {}
    const enabled = u.enabled !== false
    const hours = u.hoursPerDay ?? a.hoursPerDay
    const qty = u.quantity ?? a.quantity
    const duty = u.dutyCycleFraction ?? a.dutyCycleFraction ?? 1
    const start = u.startHour ?? a.startHour
    const end = u.endHour ?? a.endHour
    const dailyWh = enabled ? a.powerW * qty * hours * duty + (a.standbyW ?? 0) * qty * (24 - hours) : 0
    return [
      enabled ? a.name : { text: `${a.name} (off in this scenario)`, color: COLOURS.muted },
      CATEGORY_LABELS[a.category] ?? a.category,
      a.supply.toUpperCase(),
      `${num(a.powerW)} W`,
      num(qty),
      `${num(hours, 1)} h`,
      `${String(start).padStart(2, '0')}–${String(end).padStart(2, '0')}`,
      duty < 1 ? pct(duty) : '—',
      energy(dailyWh),
    ]
  })
  const sourceRows = plan.sources.map((src) => {
    switch (src.kind) {
      case 'solar':
        return [
          src.name,
          'Solar array',
          `${num(src.peakPowerWp)} Wp, ${src.controller.toUpperCase()} ${num(src.maxCurrentA)} A, tilt ${num(src.tiltDeg ?? 0)}°`,
        ]
      case 'dcdc':
        return [src.name, 'Alternator (DC-DC)', `${num(src.currentA)} A while driving`]
      case 'shore':
        return [src.name, 'Shore charger', `${num(src.currentA)} A while hooked up`]
      case 'generator':
        return [src.name, 'Generator charger', `${num(src.currentA)} A while it runs`]
    }
  })
  const equipment: Node[] = [
    heading('Appliances', true),
    {
      text: 'The inventory with this scenario’s use. Daily energy is before inverter losses.',
      fontSize: 8.5,
      color: COLOURS.muted,
      margin: [0, 0, 0, 4],
    },
    plan.appliances.length
      ? table(
          ['Appliance', 'Kind', 'Supply', 'Power', 'Qty', 'Hours', 'Window', 'Duty', 'Per day'],
          appRows,
          ['*', 56, 32, 40, 22, 32, 38, 30, 50],
          {
            numeric: [3, 4, 5, 7, 8],
          },
        )
      : { text: 'No appliances.', italics: true },
    { text: 'Charge sources', style: 'h2', margin: [0, 16, 0, 6] },
    plan.sources.length
      ? table(['Name', 'Kind', 'Output'], sourceRows, ['*', 100, 220])
      : { text: 'No charge sources: the pack only empties on this trip.', italics: true },
    ...(plan.inverter
      ? [
          {
            text: `Inverter: ${num(plan.inverter.ratedW)} W rated${plan.inverter.surgeW ? `, ${num(plan.inverter.surgeW)} W surge` : ''}, ${plan.inverter.alwaysOn ? 'always on' : 'switched on when AC loads run'}.`,
            margin: [0, 8, 0, 0],
          },
        ]
      : []),
  ]

  // ---- chemistry and classic sizing ----------------------------------------------------------
  const sizing: Node[] = [
    { text: 'Lithium or lead-acid for the same usable energy', style: 'h2', margin: [0, 16, 0, 6] },
    table(
      ['Chemistry', 'Capacity', 'Mass', 'Cycle life', 'Price', 'Per delivered kWh'],
      r.chemistryComparison.map((c) => [
        {
          text: `${CHEMISTRY_LABELS[c.chemistry] ?? c.chemistry}${c.isPlanChemistry ? ' (this plan)' : ''}`,
          bold: c.isPlanChemistry,
        },
        `${num(c.capacityAh)} Ah`,
        `${num(c.massKg)} kg`,
        `${num(c.cycleLifeCycles)} cycles`,
        num(c.priceTotal),
        num(c.costPerDeliveredKWh, 2),
      ]),
      ['*', 55, 45, 65, 50, 70],
      { numeric: [1, 2, 3, 4, 5] },
    ),
    {
      text: `Prices in the plan's currency units (common practice figures, no source). Classic sizing: ${num(r.classicSizing.dailyLoadAh, 1)} Ah a day × ${num(r.classicSizing.autonomyDays, 1)} days, corrected for temperature (×${num(r.classicSizing.temperatureFactor, 2)}), ageing and margin, ÷ ${pct(r.classicSizing.depthOfDischargeFraction)} depth of discharge = ${num(r.classicSizing.capacityAh)} Ah. It assumes no charging at all over those days, so it differs from the hour-by-hour answer.`,
      fontSize: 8,
      color: COLOURS.muted,
      margin: [0, 4, 0, 0],
    },
  ]

  // ---- build sheet ----------------------------------------------------------------------------
  const build: Node[] = [heading('Build sheet', true)]
  const sheet = input.sheet
  const cautionsNear = (place: string) =>
    (sheet?.cautions ?? []).filter((c) => c.near === place).map((c) => caution(c.title, c.text))
  if (!sheet) {
    build.push({
      text: ['The build sheet could not be made: ', ...input.sheetMissing.join(' ')].join(''),
      italics: true,
    })
  } else {
    build.push(...cautionsNear('top'))
    build.push({ text: 'Protection rules', style: 'h3', margin: [0, 8, 0, 4] })
    build.push(
      table(
        ['When', 'What happens', 'Released', 'Done by'],
        sheet.protection.rules.map((rule) => [
          rule.condition,
          ACTION_LABELS[rule.action] ?? rule.action,
          rule.release,
          rule.device,
        ]),
        ['*', 90, '*', 80],
      ),
    )
    build.push(...cautionsNear('protection'), ...cautionsNear('heater'))
    build.push({ text: 'Charger settings', style: 'h3', margin: [0, 8, 0, 4] })
    build.push(
      table(
        ['Setting', 'Value'],
        sheet.protection.chargerSettings.map((c) => [c.label, c.value]),
        ['*', 140],
      ),
    )
    const rt = sheet.ratings
    build.push({ text: 'Ratings', style: 'h3', margin: [0, 8, 0, 4] })
    const rating = (label: string, d: { continuousA: number; requiredA: number; ratingA: number | null }) => [
      label,
      `${num(d.continuousA, 1)} A`,
      `${num(d.requiredA, 1)} A`,
      d.ratingA === null ? 'none listed' : `${num(d.ratingA)} A`,
    ]
    build.push(
      table(
        ['Device', 'Continuous', 'Needed', 'Rating'],
        [
          rating('Main fuse', rt.mainFuse),
          rating('Charge-path disconnect', rt.chargeDisconnect),
          rating('Load-path disconnect', rt.loadDisconnect),
          ...rt.branchFuses.map((bf) => rating(bf.label, bf)),
        ],
        ['*', 70, 70, 70],
        { numeric: [1, 2, 3] },
      ),
    )
    build.push({ text: sheet.marginRule, fontSize: 8, color: COLOURS.muted, margin: [0, 2, 0, 0] })
    for (const w of rt.warnings) build.push({ text: w, color: COLOURS.negative, margin: [0, 2, 0, 0] })
    build.push(...cautionsNear('ratings'))
    build.push({ text: 'Cables', style: 'h3', margin: [0, 8, 0, 4] })
    build.push(
      table(
        ['Run', 'Current', 'Length (one way)', 'Fuse', 'Cable'],
        sheet.cableRuns.map((c) => [
          c.label,
          `${num(c.currentA, 1)} A`,
          `${num(c.oneWayLengthM, 1)} m`,
          c.fuseA === null ? '—' : `${num(c.fuseA)} A`,
          c.sizing.metric
            ? `${num(c.sizing.metric.areaMm2, 1)} mm²${c.sizing.awg ? ` (AWG ${c.sizing.awg.label})` : ''}`
            : 'none in the table fits',
        ]),
        ['*', 50, 70, 40, 110],
        { numeric: [1, 2, 3] },
      ),
    )
    build.push(...cautionsNear('cables'), ...cautionsNear('diagram'))
    if (sheet.parts.lines.length > 0) {
      build.push({ text: 'Parts', style: 'h3', margin: [0, 8, 0, 4] })
      build.push(
        table(
          ['Part', 'Qty', 'Unit price', 'Line total'],
          sheet.parts.lines.map((p) => [
            p.name,
            p.quantity,
            `${p.unitPrice} ${p.currency}`,
            `${p.lineTotal} ${p.currency}`,
          ]),
          ['*', 40, 80, 80],
          { numeric: [1, 2, 3] },
        ),
      )
      for (const t of sheet.parts.totals)
        build.push({
          text: `Total ${t.total} ${t.currency}${t.perUsableKWh ? ` (${t.perUsableKWh} ${t.currency} per usable kWh)` : ''}`,
          bold: true,
          margin: [0, 3, 0, 0],
        })
    }
  }

  // ---- advisor ---------------------------------------------------------------------------------
  const advisor: Node[] = []
  const withWords = input.reviews.filter((rv) => rv.comments.length > 0 || rv.summary)
  if (withWords.length > 0) {
    advisor.push(heading('Advisor’s comments', true))
    for (const rv of withWords) {
      advisor.push({ text: `Review by ${rv.advisorName}`, style: 'h3' })
      if (rv.verdictLabel)
        advisor.push({ text: `Verdict: ${rv.verdictLabel}`, bold: true, color: COLOURS.slate })
      if (rv.summary) advisor.push({ text: rv.summary, margin: [0, 2, 0, 6] })
      for (const c of rv.comments)
        advisor.push({
          stack: [
            {
              text: `${c.pinLabel ? `On “${c.pinLabel}” · ` : ''}${c.author} · ${c.at}`,
              fontSize: 8,
              color: COLOURS.muted,
            },
            { text: c.body },
          ],
          margin: [8, 3, 0, 5],
        })
    }
  }

  const generated = input.generatedAt.toISOString().slice(0, 16).replace('T', ' ') + ' UTC'
  return {
    info: {
      title: `${vehicle.name} · ${scenario.name} · Ohmward plan report`,
      author: 'Ohmward',
      subject: 'Plan report',
    },
    pageSize: 'A4',
    pageMargins: [40, 46, 40, 46],
    defaultStyle: { font: 'Nunito', fontSize: 9.5, lineHeight: 1.15, color: '#1E2626' },
    header: (page: number) =>
      page === 1
        ? null
        : {
            text: `${vehicle.name} · ${scenario.name}`,
            margin: [40, 20, 40, 0],
            fontSize: 8,
            color: COLOURS.muted,
          },
    footer: (page: number, pages: number) => ({
      columns: [
        {
          text: `Ohmward plan report · made ${generated} · a plan, not a guarantee; follow local codes`,
          fontSize: 7.5,
          color: COLOURS.muted,
        },
        {
          text: `page ${page} of ${pages}`,
          alignment: 'right',
          fontSize: 7.5,
          color: COLOURS.muted,
          width: 70,
        },
      ],
      margin: [40, 14, 40, 0],
    }),
    content: withFontFallbacks([
      ...cover,
      ...charts,
      ...daily,
      ...equipment,
      ...sizing,
      ...build,
      ...advisor,
    ]),
    styles: {
      brand: { fontSize: 16, bold: true, color: COLOURS.spruce },
      h1: { fontSize: 24, bold: true, color: COLOURS.spruce },
      subtitle: { fontSize: 15, color: COLOURS.slate },
      h2: { fontSize: 15, bold: true, color: COLOURS.spruce, margin: [0, 0, 0, 6] },
      h3: { fontSize: 11, bold: true, color: COLOURS.slate, margin: [0, 4, 0, 4] },
      th: { bold: true, fontSize: 8, color: COLOURS.muted },
      table: { fontSize: 8 },
      figLabel: { fontSize: 8, color: COLOURS.muted },
      figValue: { fontSize: 13, bold: true },
      figNote: { fontSize: 7.5, color: COLOURS.muted },
    },
  }
}

const ACTION_LABELS: Record<string, string> = {
  'charge-path-opens': 'Charging stops',
  'load-path-opens': 'Loads are cut off',
  'inverter-off': 'Inverter turns off',
  'heater-on': 'Heater pad on',
  'heater-off': 'Heater pad off',
}
