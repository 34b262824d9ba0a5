// RS-274 program for a surfacing plan (word meanings as in the NIST RS274/NGC interpreter
// specification, NISTIR 6556). At most one word per modal group on a line; units, distance mode,
// plane, feed mode and work offset are set explicitly before any motion; safe Z before every
// rapid; the cutter is lifted to safe Z and moved over the start point before the spindle
// starts (after a paper-feeler Z zero it sits a fraction of a millimetre above the board); the
// spindle is stopped before the program ends.
import type { DwellUnit, SurfacingPlan } from './surfacing'
import { formatDuration, formatNumber, type LengthUnit } from './units'

/** Decimals written in the program: a micron in mm, a ten-thousandth in inches. */
export const GCODE_DECIMALS: Record<LengthUnit, number> = { mm: 3, in: 4 }
const FEED_WORD_DECIMALS: Record<LengthUnit, number> = { mm: 1, in: 2 }

// Up to `decimals`, without trailing zeros: F3000, F118.11.
function trimmed(value: number, decimals: number): string {
  return formatNumber(value, decimals).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '')
}

// Comment text may not contain parentheses (RS-274 comments do not nest).
function comment(text: string): string {
  return `(${text.replace(/[()]/g, ' ').slice(0, 250)})`
}

/** The P word of a G4 dwell of `seconds`, in the unit the machine's control reads. */
export function dwellWord(seconds: number, unit: DwellUnit): string {
  return unit === 'milliseconds' ? `P${Math.round(seconds * 1000)}` : `P${trimmed(seconds, 1)}`
}

export function surfacingGcode(plan: SurfacingPlan): string {
  const v = plan.input
  const u = plan.units
  const d = GCODE_DECIMALS[u]
  const n = (value: number) => formatNumber(value, d)
  const feedWord = (value: number) => `F${trimmed(value, FEED_WORD_DECIMALS[u])}`
  const rough = plan.passes.filter(p => !p.finishing)
  const finish = plan.passes.find(p => p.finishing)
  const depthText = `${rough.length} roughing pass${rough.length === 1 ? '' : 'es'} of ${n(rough[0]!.depth)}`
    + (finish ? ` then a finishing pass of ${n(finish.depth)}` : '')

  const out: string[] = [
    '%',
    comment('Jogwise surfacing program'),
    comment(`Units ${u}. Work zero: front-left corner of the area, on its top surface`),
    comment(`Area X ${n(v.area.x)} by Y ${n(v.area.y)}, cutter centre runs ${n(plan.overhang)} past each edge`),
    comment(`Cutter diameter ${n(v.cutter.diameter)}, ${v.cutter.flutes} flute${v.cutter.flutes === 1 ? '' : 's'}`),
    comment(`${plan.lineCount} lines along ${plan.rasterAxis.toUpperCase()}, ${v.pattern}, stepover ${n(plan.stepover.actual)} = ${formatNumber(plan.stepover.actualPct, 1)} pct of diameter, asked ${formatNumber(v.stepoverPct, 1)} pct`),
    comment(`Depth ${n(v.totalDepth)} in ${depthText}, final Z ${n(-v.totalDepth)}`),
    comment(`Milling ${plan.milling === 'alternating' ? 'alternates climb and conventional, zigzag' : `${plan.milling} on every line, spindle M3 clockwise`}`),
    comment(`Feed ${trimmed(v.feed, FEED_WORD_DECIMALS[u])} ${u}/min, plunge ${trimmed(v.plunge, FEED_WORD_DECIMALS[u])} ${u}/min, spindle ${Math.round(v.rpm)} rpm, safe Z ${n(v.safeZ)}`),
  ]
  if (v.cutter.maxRpm !== undefined) out.push(comment(`Cutter${v.cutter.name ? ` ${v.cutter.name}` : ''} rated to ${v.cutter.maxRpm} rpm`))
  for (const w of plan.warnings) out.push(comment(`${w.signal}: ${w.message}`))
  const dwellUnit = plan.settings.dwellUnit
  if (v.spinUpSeconds) {
    out.push(comment(dwellUnit === 'milliseconds'
      ? `Spin-up dwell ${trimmed(v.spinUpSeconds, 1)} s written as G4 P in milliseconds, as this machine's control reads it, NIST RS274/NGC, NISTIR 6556, reads P in seconds`
      : `Spin-up dwell G4 P in seconds, as NIST RS274/NGC, NISTIR 6556, a control that reads P in milliseconds needs the machine's dwell setting changed`))
  }
  out.push(
    comment(`Estimated run time ${formatDuration(plan.time.total)}`),
    comment('Check the preview, clear the bed and stay at the machine while it cuts'),
    u === 'mm' ? 'G21' : 'G20',
    'G90',
    'G17',
    'G94',
    'G54',
  )

  let feed = Number.NaN
  let x = ''
  let y = ''
  let spindleOn = false
  for (const m of plan.moves) {
    const mx = n(m.x)
    const my = n(m.y)
    // The moves up to the first plunge lift to safe Z and go over the start point.
    if (!spindleOn && m.kind !== 'retract' && m.kind !== 'rapid') {
      out.push(`S${Math.round(v.rpm)} M3`)
      if (v.spinUpSeconds) out.push(`G4 ${dwellWord(v.spinUpSeconds, dwellUnit)}`)
      spindleOn = true
    }
    if (m.kind === 'retract') {
      out.push(`G0 Z${n(m.z)}`)
    }
    else if (m.kind === 'rapid') {
      out.push(`G0 X${mx} Y${my}`)
    }
    else if (m.kind === 'plunge') {
      out.push(`G1 Z${n(m.z)}${feed === v.plunge ? '' : ` ${feedWord(v.plunge)}`}`)
      feed = v.plunge
    }
    else {
      // Cuts and zigzag stepovers move one axis at a time; write only what changes, but
      // never a G1 without an axis word.
      const words = [mx !== x ? `X${mx}` : '', my !== y ? `Y${my}` : ''].filter(Boolean)
      if (words.length === 0) words.push(`X${mx}`)
      out.push(`G1 ${words.join(' ')}${feed === v.feed ? '' : ` ${feedWord(v.feed)}`}`)
      feed = v.feed
    }
    x = mx
    y = my
  }
  out.push('M5', 'M30', '%')
  return `${out.join('\n')}\n`
}
