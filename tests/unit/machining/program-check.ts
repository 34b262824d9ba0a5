// Reads a program back through an independent npm G-code toolpath library and checks the
// RS-274 line rules of the NIST RS274/NGC interpreter specification (NISTIR 6556).
import Toolpath from 'gcode-toolpath'

export interface Segment { motion: string, from: { x: number, y: number, z: number }, to: { x: number, y: number, z: number }, feed: number }

/** Segments in millimetres (the library converts G20 programs to mm), with the F in force. */
export function readProgram(text: string) {
  // The library reports a line's motion before its per-line callback, so find the F in force
  // on every line first (Table 8 of NISTIR 6556: F is set before the line's motion).
  const parsed = new Toolpath().loadFromStringSync(text)
  const feedAt: number[] = []
  let feed = Number.NaN
  for (const line of parsed) {
    for (const [letter, value] of line.words) if (letter === 'F') feed = value
    feedAt.push(feed)
  }
  const segments: Segment[] = []
  let index = 0
  const toolpath = new Toolpath({
    addLine: (modal, v1, v2) => {
      segments.push({ motion: modal.motion, from: { ...v1 }, to: { ...v2 }, feed: feedAt[index]! })
    },
  })
  const lines = toolpath.loadFromStringSync(text, (_line, i) => {
    index = i + 1
  })
  return { segments, lines, modal: toolpath.getModal() }
}

// NIST RS274/NGC interpreter, NISTIR 6556 Table 4 (modal groups).
const G_GROUPS: Record<string, number[]> = {
  0: [4, 10, 28, 30, 53, 92, 92.1, 92.2, 92.3],
  1: [0, 1, 2, 3, 38.2, 80, 81, 82, 83, 84, 85, 86, 87, 88, 89],
  2: [17, 18, 19],
  3: [90, 91],
  5: [93, 94],
  6: [20, 21],
  7: [40, 41, 42],
  8: [43, 49],
  10: [98, 99],
  12: [54, 55, 56, 57, 58, 59, 59.1, 59.2, 59.3],
  13: [61, 61.1, 64],
}
const M_GROUPS: Record<string, number[]> = {
  4: [0, 1, 2, 30, 60],
  6: [6],
  7: [3, 4, 5],
  8: [7, 8, 9],
  9: [48, 49],
}
const groupOf = (groups: Record<string, number[]>, code: number) =>
  Object.keys(groups).find(g => groups[g]!.some(c => Math.abs(c - code) < 1e-4))

/** Every breach of the NISTIR 6556 line rules below (and our explicit-setup rule), as readable strings; [] when the program is clean. */
export function rs274Problems(text: string): string[] {
  const problems: string[] = []
  const raw = text.split('\n')
  const nonBlank = raw.map(l => l.trim()).filter(Boolean)
  // NISTIR 6556 §3.1: % must be both the first and the last non-blank line if used.
  if (nonBlank.includes('%') && (nonBlank[0] !== '%' || nonBlank.at(-1) !== '%')) problems.push('% is not first and last')
  nonBlank.forEach((l, i) => {
    if (l.length > 256) problems.push(`line ${i + 1} is longer than 256 characters`) // NISTIR 6556 §3.3
  })
  const { lines } = readProgram(text)
  let motion: number | null = null
  let units = 0
  const set = { units: false, distance: false, plane: false, feedMode: false }
  let feed = 0
  let spindleOn = false
  let speed = 0
  let sawMotion = false
  let sawCut = false
  lines.forEach(({ line, words }, i) => {
    const where = `line ${i + 1} "${line}"`
    const gs = words.filter(([l]) => l === 'G').map(([, v]) => v)
    const ms = words.filter(([l]) => l === 'M').map(([, v]) => v)
    // NISTIR 6556 §3.3.5, Table 4: no two G words from one modal group.
    const gGroups = gs.map(code => groupOf(G_GROUPS, code))
    if (gGroups.some(g => g === undefined)) problems.push(`${where}: unknown G code`)
    if (new Set(gGroups).size !== gGroups.length) problems.push(`${where}: two G words from one modal group`)
    // NISTIR 6556 §3.3.5: at most 4 M words, none from the same group.
    const mGroups = ms.map(code => groupOf(M_GROUPS, code))
    if (ms.length > 4) problems.push(`${where}: more than 4 M words`)
    if (mGroups.some(g => g === undefined)) problems.push(`${where}: unknown M code`)
    if (new Set(mGroups).size !== mGroups.length) problems.push(`${where}: two M words from one modal group`)
    // NISTIR 6556 §3.3.5: other letters at most once per line.
    const others = words.filter(([l]) => l !== 'G' && l !== 'M').map(([l]) => l)
    if (new Set(others).size !== others.length) problems.push(`${where}: a word letter repeats`)
    const value = (letter: string) => words.find(([l]) => l === letter)?.[1]
    // NISTIR 6556 §3.7.2 (a negative S is an error; F is held to the same): no negative F or S.
    if ((value('F') ?? 0) < 0 || (value('S') ?? 0) < 0) problems.push(`${where}: negative F or S`)
    if (value('F') !== undefined) feed = value('F')!
    if (value('S') !== undefined) speed = value('S')!
    if (gs.some(g => g === 20 || g === 21)) {
      units++
      if (sawMotion) problems.push(`${where}: units set after motion`) // NISTIR 6556 §3.5.7 advice
      set.units = true
    }
    if (gs.includes(90)) set.distance = true
    if (gs.includes(17)) set.plane = true
    if (gs.includes(94)) set.feedMode = true
    if (ms.includes(3)) spindleOn = true
    if (ms.includes(5)) spindleOn = false
    const motionWord = gs.find(g => groupOf(G_GROUPS, g) === '1')
    if (motionWord !== undefined) motion = motionWord
    const axisWords = words.filter(([l]) => 'XYZABC'.includes(l))
    const isMotion = axisWords.length > 0 && !gs.some(g => groupOf(G_GROUPS, g) === '0')
    // NISTIR 6556 §3.5.1-3.5.2: a G0/G1 line needs an axis word.
    if (motionWord !== undefined && axisWords.length === 0) problems.push(`${where}: motion without an axis word`)
    if (isMotion) {
      if (!set.units || !set.distance || !set.plane || !set.feedMode) problems.push(`${where}: motion before G20/G21, G90, G17 and G94 are set`) // NISTIR 6556 §3.5.7; explicit setup is common practice, no published source
      sawMotion = true
      if (motion === 1) {
        if (!(feed > 0)) problems.push(`${where}: G1 with no feed in force`) // NISTIR 6556 App. A, zero feed error
        if (!spindleOn || !(speed > 0)) problems.push(`${where}: cutting with the spindle off`) // NISTIR 6556 §3.6.2, §3.7.2
        sawCut = true
      }
    }
  })
  if (units !== 1) problems.push(`units set ${units} times, not once`) // NISTIR 6556 §3.5.7 advice
  if (!sawCut) problems.push('no cutting move')
  // NISTIR 6556 §3.6.1: the program ends with M30 (or M2); stopping the spindle first with M5
  // is common practice, no published source.
  const coded = lines.filter(l => l.words.length > 0)
  const tail = coded.slice(-2).map(l => l.words.map(([a, b]) => `${a}${b}`).join(' '))
  if (tail[0] !== 'M5' || (tail[1] !== 'M30' && tail[1] !== 'M2')) problems.push(`program ends with ${tail.join(', ')}, not M5 then M30`)
  return problems
}
