/**
 * The one-line diagram as data: boxes and wires with coordinates, drawn as SVG by a Vue component.
 * Pure, so a test can check its structure (one box per piece of equipment) without pixels.
 *
 * Layout, top to bottom: load lists · sources and loads · branch fuses · charge and load busbars ·
 * the two one-direction disconnects · main fuse · pack with BMS and battery monitor.
 * Charge side on the left, load side on the right; control wires (dashed) run on a rail at the left edge.
 */
import type { ResolvedPlan } from '../engine/presets.ts'
import type { Ratings } from './ratings.ts'

export type DiagramNodeKind =
  | 'pack'
  | 'bms'
  | 'monitor'
  | 'main-fuse'
  | 'charge-disconnect'
  | 'load-disconnect'
  | 'charge-bus'
  | 'load-bus'
  | 'source'
  | 'fuse'
  | 'inverter'
  | 'dc-panel'
  | 'heater'
  | 'load-list'

export interface DiagramNode {
  id: string
  kind: DiagramNodeKind
  label: string
  /** Short lines under the label (ratings, settings). */
  details: string[]
  x: number
  y: number
  width: number
  height: number
}

export type DiagramEdgeKind = 'positive' | 'negative' | 'control' | 'ac'

export interface DiagramEdge {
  id: string
  kind: DiagramEdgeKind
  from: string
  to: string
  /** Polyline through these points. */
  points: [number, number][]
  label?: string
}

export interface Diagram {
  width: number
  height: number
  nodes: DiagramNode[]
  edges: DiagramEdge[]
}

const COL_W = 180
const BOX_W = 156
const MARGIN_X = 56
const HALF_MIN_W = 300
const ROW_Y = [16, 130, 230, 310, 370, 460, 550] as const
const BOX_H = [84, 70, 48, 20, 56, 52, 76] as const

const SOURCE_LABEL: Record<string, string> = {
  solar: 'Solar controller',
  dcdc: 'DC-DC charger',
  shore: 'Shore charger',
  generator: 'Generator charger',
}

const r1 = (x: number) => String(Math.round(x * 10) / 10)
const amps = (x: number | null) => (x === null ? 'no standard size' : `${r1(x)} A`)

/** Build the diagram for a plan and its ratings. */
export function buildDiagram(plan: ResolvedPlan, ratings: Ratings): Diagram {
  const nodes: DiagramNode[] = []
  const edges: DiagramEdge[] = []
  const b = plan.battery
  const fuseOf = (id: string) => ratings.branchFuses.find((f) => f.id === id)?.ratingA ?? null

  type Column = {
    key: string
    node: Omit<DiagramNode, 'x' | 'y' | 'width' | 'height'>
    fuseId: string
    list?: string[]
  }
  const left: Column[] = ratings.sources.map((s) => ({
    key: `source:${s.id}`,
    node: {
      id: `source:${s.id}`,
      kind: 'source',
      label: s.name,
      details: [SOURCE_LABEL[s.kind] ?? s.kind, `${r1(s.currentA)} A out`],
    },
    fuseId: `fuse:source:${s.id}`,
  }))
  const right: Column[] = []
  if (ratings.inverter) {
    right.push({
      key: 'inverter',
      node: {
        id: 'inverter',
        kind: 'inverter',
        label: 'Inverter',
        details: [
          `${r1(ratings.inverter.ratedW)} W · surge ${r1(ratings.inverter.surgeW)} W`,
          `${r1(ratings.inverter.continuousA)} A DC in`,
        ],
      },
      fuseId: 'fuse:inverter',
      list: plan.appliances.filter((a) => a.supply === 'ac' && a.quantity > 0).map((a) => a.name),
    })
  }
  if (ratings.dcLoads.length > 0) {
    right.push({
      key: 'dc-panel',
      node: {
        id: 'dc-panel',
        kind: 'dc-panel',
        label: 'DC fuse panel',
        details: [`${ratings.dcLoads.length} circuits`, `${r1(ratings.dcLoadA)} A all on`],
      },
      fuseId: 'fuse:dc-panel',
      list: ratings.dcLoads.map((l) => l.name),
    })
  }
  if (b.heater) {
    right.push({
      key: 'heater',
      node: {
        id: 'heater',
        kind: 'heater',
        label: 'Heater pad',
        details: [
          `${r1(b.heater.powerW)} W`,
          `on < ${r1(b.heater.onBelowC)} °C, off > ${r1(b.heater.offAboveC)} °C`,
        ],
      },
      fuseId: 'fuse:heater',
    })
  }

  const nLeft = Math.max(1, left.length)
  const nRight = Math.max(1, right.length)
  // Each half is wide enough for its columns and for the BMS (left) or monitor (right) beside the pack.
  const leftW = Math.max(nLeft * COL_W, HALF_MIN_W)
  const rightW = Math.max(nRight * COL_W, HALF_MIN_W)
  const width = MARGIN_X + leftW + rightW + 24
  const leftX0 = MARGIN_X + (leftW - nLeft * COL_W) / 2
  const rightX0 = MARGIN_X + leftW + (rightW - nRight * COL_W) / 2
  const colX = (x0: number, i: number) => x0 + i * COL_W + (COL_W - BOX_W) / 2
  const center = (n: DiagramNode): number => n.x + n.width / 2
  const add = (n: DiagramNode) => {
    nodes.push(n)
    return n
  }
  const wire = (
    id: string,
    kind: DiagramEdgeKind,
    from: string,
    to: string,
    points: [number, number][],
    label?: string,
  ) => edges.push({ id, kind, from, to, points, ...(label ? { label } : {}) })

  // Busbars
  const chargeBus = add({
    id: 'charge-bus',
    kind: 'charge-bus',
    label: 'Charge busbar (+)',
    details: [],
    x: leftX0 + 8,
    y: ROW_Y[3],
    width: nLeft * COL_W - 16,
    height: BOX_H[3],
  })
  const loadBus = add({
    id: 'load-bus',
    kind: 'load-bus',
    label: 'Load busbar (+)',
    details: [],
    x: rightX0 + 8,
    y: ROW_Y[3],
    width: nRight * COL_W - 16,
    height: BOX_H[3],
  })

  const placeColumn = (c: Column, x: number, bus: DiagramNode) => {
    if (c.list && c.list.length > 0) {
      const shown = c.list.slice(0, 3)
      const more = c.list.length - shown.length
      const list = add({
        id: `${c.key}:loads`,
        kind: 'load-list',
        label: c.key === 'inverter' ? 'AC outlets' : 'DC circuits',
        details: more > 0 ? [...shown, `+ ${more} more`] : shown,
        x,
        y: ROW_Y[0],
        width: BOX_W,
        height: BOX_H[0],
      })
      wire(`${c.key}:loads-wire`, c.key === 'inverter' ? 'ac' : 'positive', c.key, list.id, [
        [x + BOX_W / 2, ROW_Y[1]],
        [x + BOX_W / 2, ROW_Y[0] + BOX_H[0]],
      ])
    }
    const dev = add({ ...c.node, x, y: ROW_Y[1], width: BOX_W, height: BOX_H[1] })
    const fuse = add({
      id: c.fuseId,
      kind: 'fuse',
      label: `Fuse ${amps(fuseOf(c.fuseId))}`,
      details: [],
      x: x + 28,
      y: ROW_Y[2],
      width: BOX_W - 56,
      height: BOX_H[2] - 16,
    })
    const cx = center(dev)
    wire(`${dev.id}:to-fuse`, 'positive', dev.id, fuse.id, [
      [cx, ROW_Y[1] + BOX_H[1]],
      [cx, fuse.y],
    ])
    wire(`${fuse.id}:to-bus`, 'positive', fuse.id, bus.id, [
      [cx, fuse.y + fuse.height],
      [cx, bus.y],
    ])
  }
  left.forEach((c, i) => placeColumn(c, colX(leftX0, i), chargeBus))
  right.forEach((c, i) => placeColumn(c, colX(rightX0, i), loadBus))

  // Disconnects under the busbars' middles.
  const cdX = center(chargeBus) - BOX_W / 2
  const ldX = center(loadBus) - BOX_W / 2
  const cd = add({
    id: 'charge-disconnect',
    kind: 'charge-disconnect',
    label: 'Charge-path disconnect',
    details: [`one-direction, ≥ ${amps(ratings.chargeDisconnect.ratingA)}`],
    x: cdX,
    y: ROW_Y[4],
    width: BOX_W,
    height: BOX_H[4],
  })
  const ld = add({
    id: 'load-disconnect',
    kind: 'load-disconnect',
    label: 'Load-path disconnect',
    details: [`one-direction, ≥ ${amps(ratings.loadDisconnect.ratingA)}`],
    x: ldX,
    y: ROW_Y[4],
    width: BOX_W,
    height: BOX_H[4],
  })
  wire('charge-bus:to-disconnect', 'positive', 'charge-bus', cd.id, [
    [center(cd), chargeBus.y + chargeBus.height],
    [center(cd), cd.y],
  ])
  wire('load-bus:to-disconnect', 'positive', 'load-bus', ld.id, [
    [center(ld), loadBus.y + loadBus.height],
    [center(ld), ld.y],
  ])

  const midX = MARGIN_X + leftW
  const mf = add({
    id: 'main-fuse',
    kind: 'main-fuse',
    label: `Main fuse ${amps(ratings.mainFuse.ratingA)}`,
    details: ['within 18 cm of the pack'],
    x: midX - BOX_W / 2,
    y: ROW_Y[5],
    width: BOX_W,
    height: BOX_H[5],
  })
  const joinY = ROW_Y[4] + BOX_H[4] + (ROW_Y[5] - ROW_Y[4] - BOX_H[4]) / 2
  for (const d of [cd, ld]) {
    wire(`${d.id}:to-main-fuse`, 'positive', d.id, mf.id, [
      [center(d), d.y + d.height],
      [center(d), joinY],
      [midX, joinY],
      [midX, mf.y],
    ])
  }

  const packW = BOX_W + 24
  const pack = add({
    id: 'pack',
    kind: 'pack',
    label: 'Battery pack',
    details: [
      `${b.chemistry.toUpperCase()} ${b.cellsSeries}S${b.cellsParallel}P`,
      `${r1(b.nominalVoltageV)} V · ${r1(b.capacityAh)} Ah`,
    ],
    x: midX - packW / 2,
    y: ROW_Y[6],
    width: packW,
    height: BOX_H[6],
  })
  wire('main-fuse:to-pack', 'positive', mf.id, pack.id, [
    [midX, mf.y + mf.height],
    [midX, pack.y],
  ])
  const lithium = b.chemistry === 'lfp'
  const bms = add({
    id: 'bms',
    kind: 'bms',
    label: lithium ? 'BMS' : 'Battery protect relay',
    details: ['cell voltages', 'cell temperatures'],
    x: pack.x - BOX_W - 28,
    y: ROW_Y[6] + 8,
    width: BOX_W,
    height: BOX_H[6] - 16,
  })
  const monitor = add({
    id: 'monitor',
    kind: 'monitor',
    label: 'Battery monitor (shunt)',
    details: ['in the negative', 'state-of-charge relay'],
    x: pack.x + pack.width + 28,
    y: ROW_Y[6] + 8,
    width: BOX_W,
    height: BOX_H[6] - 16,
  })
  const packMidY = pack.y + pack.height / 2
  wire(
    'pack:sense',
    'control',
    pack.id,
    bms.id,
    [
      [pack.x, packMidY],
      [bms.x + bms.width, packMidY],
    ],
    'sense',
  )
  wire(
    'pack:negative',
    'negative',
    pack.id,
    monitor.id,
    [
      [pack.x + pack.width, packMidY],
      [monitor.x, packMidY],
    ],
    '−',
  )

  // Control wires on the left rail: BMS to the disconnects' enable inputs, the inverter's remote, the heater.
  const targets: [string, string][] = [
    ['charge-disconnect', 'enable'],
    ['load-disconnect', 'enable'],
  ]
  if (ratings.inverter) targets.push(['inverter', 'remote on/off'])
  if (b.heater) targets.push(['heater', 'relay'])
  const startY = bms.y + bms.height / 2
  targets.forEach(([id, label], i) => {
    const t = nodes.find((n) => n.id === id)!
    const lane = 10 + i * 8
    const entryX = t.x + 14 + i * 4
    wire(
      `bms:${id}`,
      'control',
      bms.id,
      id,
      [
        [bms.x, startY + (i - 1) * 6],
        [lane, startY + (i - 1) * 6],
        [lane, t.y - 8 - i * 3],
        [entryX, t.y - 8 - i * 3],
        [entryX, t.y],
      ],
      label,
    )
  })
  if (ratings.inverter) {
    const inv = nodes.find((n) => n.id === 'inverter')!
    const y = monitor.y + monitor.height / 2
    const railX = width - 10
    wire(
      'monitor:inverter',
      'control',
      monitor.id,
      inv.id,
      [
        [monitor.x + monitor.width, y],
        [railX, y],
        [railX, inv.y - 6],
        [inv.x + inv.width - 14, inv.y - 6],
        [inv.x + inv.width - 14, inv.y],
      ],
      'SOC relay',
    )
  }

  const height = ROW_Y[6] + BOX_H[6] + 16
  return { width, height, nodes, edges }
}
