import { describe, expect, it } from 'vitest'
import { parseProcedure, SUPPLEMENT_NOTICE, type HoldStep, type Procedure, type ProcedureStep } from '../../../shared/procedures/schema'
import { STARTER_LIBRARY, starterProcedure } from '../../../shared/procedures/starter-library'

// Content checks of the starter library against the safety sources named beside each check. These
// are checks on the text a shop starts with, not legal advice.

const parsed = new Map<string, Procedure>(STARTER_LIBRARY.map((p) => {
  const r = parseProcedure(p)
  if (!r.ok) throw new Error(`${p.slug}: ${JSON.stringify(r.issues)}`)
  return [p.slug, r.procedure]
}))
const proc = (slug: string) => parsed.get(slug)!
const holds = (p: Procedure) => p.steps.filter((s): s is HoldStep => s.kind === 'hold')
const indexOf = (p: Procedure, key: string) => {
  const i = p.steps.findIndex(s => s.key === key)
  expect(i, `${key} in ${p.title}`).toBeGreaterThanOrEqual(0)
  return i
}
const text = (s: ProcedureStep) => [s.title, s.body, s.guidance, s.kind === 'hold' ? `${s.hazard} ${s.avoid}` : ''].join(' ')

describe('starter library', () => {
  it('has the procedures the brief lists, each once', () => {
    expect(STARTER_LIBRARY.map(p => p.slug)).toEqual([
      'spoilboard-resurfacing', 'stock-flattening', 'spindle-tram-check', 'tool-change',
      'daily-start-up', 'end-of-day-shutdown', 'emergency-stop-test',
    ])
    expect(starterProcedure('tool-change')?.title).toBe('Change the collet and bit')
    expect(starterProcedure('nope')).toBeUndefined()
  })

  it.each(STARTER_LIBRARY.map(p => [p.slug, p] as const))('%s passes the procedure schema', (_slug, p) => {
    const r = parseProcedure(p)
    expect(r.ok ? [] : r.issues).toEqual([])
  })

  // Brief, "Safety": the app supplements the maker's manual, local codes and competent practice.
  it.each(STARTER_LIBRARY.map(p => [p.slug, p] as const))('%s carries the supplement notice', (_slug, p) => {
    expect(p.supplementNotice).toBe(SUPPLEMENT_NOTICE)
    expect(SUPPLEMENT_NOTICE).toMatch(/maker's manual/)
    expect(SUPPLEMENT_NOTICE).toMatch(/local codes/)
    expect(SUPPLEMENT_NOTICE).toMatch(/competent .*practice/)
  })

  // Brief: trainees get extra explanation on every step.
  it.each(STARTER_LIBRARY.map(p => [p.slug, p] as const))('%s explains every step for trainees', (slug) => {
    for (const s of proc(slug).steps) expect(s.guidance.length, s.key).toBeGreaterThan(20)
  })
})

describe('signal words of the starter holds', () => {
  // ANSI Z535.4-2007 §4.14: WARNING/DANGER for death or serious injury,
  // CAUTION for minor or moderate injury, NOTICE for property only. Each row says why.
  const expected: [string, string, readonly string[], string][] = [
    ['spoilboard-resurfacing', 'isolate-power', ['WARNING', 'DANGER'], '29 CFR 1910.147 LOTO: shock or unexpected start-up while hands are near the cutter'],
    ['spoilboard-resurfacing', 'isolate-power-sensor', ['WARNING', 'DANGER'], '29 CFR 1910.147 LOTO, same hazard when plugging the sensor back in'],
    ['spoilboard-resurfacing', 'protective-gear', ['WARNING'], '29 CFR 1910.133 eyes, 1910.95 noise, IARC Vol. 62 wood dust Group 1 carcinogen: serious harm'],
    ['spoilboard-resurfacing', 'stay-with-machine', ['WARNING'], 'common practice, no published source: thrown cutter or dust fire, serious injury'],
    ['spoilboard-resurfacing', 'spindle-stopped-vbit', ['WARNING', 'DANGER'], '29 CFR 1910.147(a)(1)(i): unexpected start-up while hands are near the cutter'],
    ['spoilboard-resurfacing', 'homing-clear', ['CAUTION'], 'pinch by the moving gantry: minor or moderate injury'],
    ['spoilboard-resurfacing', 'sharp-edges', ['CAUTION'], 'cuts while handling a cutter: minor or moderate injury'],
    ['spoilboard-resurfacing', 'depth-notice', ['NOTICE'], 'ANSI Z535.4 NOTICE, property only: surfacing too deep damages the spoilboard'],
    ['spoilboard-resurfacing', 'sensor-off-notice', ['NOTICE'], 'cutter driven into the board: equipment damage only'],
    ['spoilboard-resurfacing', 'coolant-notice', ['NOTICE'], 'overheated spindle: equipment damage only'],
    ['stock-flattening', 'hold-down', ['WARNING'], 'stock thrown by the cutter: serious injury'],
    ['spoilboard-resurfacing', 'cutter-rating', ['WARNING'], 'a cutter over its rated speed or with a loose insert can break apart: serious injury'],
    ['stock-flattening', 'cutter-rating', ['WARNING'], 'the same hazard on the slab cutter'],
    ['stock-flattening', 'clamps-clear', ['WARNING'], 'shattered cutter and clamp thrown: serious injury'],
    ['spindle-tram-check', 'spindle-isolated', ['WARNING', 'DANGER'], '29 CFR 1910.147(a)(1)(i): unexpected start with hands at the sweep arm'],
    ['spindle-tram-check', 'why-tram', ['NOTICE'], 'ridges on faced surfaces: quality only (tilted-cutter geometry, hand calculation)'],
    ['tool-change', 'insertion-depth', ['WARNING'], 'bit thrown from the spindle: serious injury'],
    ['tool-change', 'wrenches-off', ['WARNING'], 'wrench flung out at speed: serious injury'],
    ['tool-change', 'collet-notice', ['NOTICE'], 'slipping bit ruins work and bit: property only'],
    ['daily-start-up', 'estop-reachable', ['WARNING'], '29 CFR 1910.213(b)(1), paragraph number from memory: a stop out of reach cannot prevent serious injury'],
    ['daily-start-up', 'warm-up-notice', ['NOTICE'], 'bearing wear: equipment only'],
    ['end-of-day-shutdown', 'dust-clean', ['WARNING'], 'IARC Vol. 62, 88 and 100C: wood dust and formaldehyde are Group 1 carcinogens'],
    ['emergency-stop-test', 'test-hazard', ['WARNING', 'DANGER'], 'a failing stop keeps the machine moving near people'],
    ['emergency-stop-test', 'failed-stop', ['WARNING', 'DANGER'], '29 CFR 1910.213(b): a machine that cannot be stopped'],
  ]
  it.each(expected)('%s / %s is %j (%s)', (slug, key, words) => {
    const step = proc(slug).steps.find(s => s.key === key)
    expect(step?.kind).toBe('hold')
    expect(words).toContain((step as HoldStep).signalWord)
  })

  // The words in each hazard statement must match the level of harm its signal word stands for.
  const injury = /injur|blind|cancer|shock|\bcuts?\b|sever|finger|hearing|pinch|strike|thrown|flung|fire|hands/i
  const serious = /serious|blind|cancer|shock|sever|permanent|fire|death|kill/i
  const allHolds = STARTER_LIBRARY.flatMap(p => holds(proc(p.slug)).map(h => [p.slug, h.key, h] as const))
  it.each(allHolds)('%s / %s: hazard wording fits its signal word', (_slug, _key, h) => {
    if (h.signalWord === 'NOTICE') {
      expect(h.hazard).not.toMatch(injury)
      expect(h.hazard).toMatch(/damage|ruin|wear|overheat|board|ridge|cutter into/i)
    }
    else {
      expect(h.hazard).toMatch(injury)
      if (h.signalWord === 'CAUTION') expect(h.hazard).not.toMatch(serious)
      else expect(h.hazard).toMatch(serious)
    }
  })

  it('every procedure that cuts or runs the spindle asks for eye, hearing and dust protection first', () => {
    // The first step in each procedure where the spindle runs.
    const firstRun: Record<string, string> = {
      'spoilboard-resurfacing': 'start-extraction',
      'stock-flattening': 'start-extraction',
      'daily-start-up': 'warm-up',
      'emergency-stop-test': 'spindle-stop-test',
    }
    for (const [slug, runKey] of Object.entries(firstRun)) {
      const p = proc(slug)
      const gear = p.steps.find(s => s.key === 'protective-gear') as HoldStep
      expect(gear.signalWord).toBe('WARNING')
      // Eyes with side shields (29 CFR 1910.133), hearing (1910.95), respiratory protection for dust
      // (IARC Vol. 62 wood dust Group 1; NIOSH REL 1 mg/m³ as listed by OSHA's Wood Dust page).
      expect(gear.avoid).toMatch(/side shields/)
      expect(gear.avoid).toMatch(/ear muffs|plugs/)
      expect(gear.avoid).toMatch(/respirator|dust mask/)
      expect(p.steps[indexOf(p, runKey)]!.body).toMatch(/spindle|warm-up/i)
      expect(indexOf(p, 'protective-gear')).toBeLessThan(indexOf(p, runKey))
    }
  })

  it('mentions formaldehyde wherever MDF dust is the hazard (IARC Monographs Vol. 88, urea resins)', () => {
    for (const h of allHolds.map(x => x[2])) if (/MDF/.test(h.hazard)) expect(h.hazard).toMatch(/formaldehyde/)
  })
})

describe('power isolation before any cable is unplugged or plugged in', () => {
  // LOTO (29 CFR 1910.147(d)): shut down, isolate, own lock and tag, stored
  // energy dissipated, isolation verified by a start attempt; cord-and-plug equipment only with
  // the plug under the worker's exclusive control (29 CFR 1910.147(a)(2)(iii)(A)).
  it('the isolation hold covers lock, tag, stored energy, a start attempt and the plug', () => {
    const h = proc('spoilboard-resurfacing').steps.find(s => s.key === 'isolate-power') as HoldStep
    expect(h.needsTrainerSignoff).toBe(true)
    expect(h.avoid).toMatch(/main isolator/)
    expect(h.avoid).toMatch(/own lock and tag/)
    expect(h.hazard).toMatch(/stored energy/)
    expect(h.avoid).toMatch(/spindle has stopped/)
    expect(h.avoid).toMatch(/Press the start control to prove nothing moves/)
    // Exclusive control of the plug (1910.147(a)(2)(iii)(A)), not merely in sight.
    expect(h.avoid).toMatch(/pull it and keep it under your own control/)
  })

  // Walks each procedure: a step that unplugs or plugs in a cable must come while power is
  // isolated, i.e. after an isolation hold and before the next "restore power".
  it.each(STARTER_LIBRARY.map(p => [p.slug]))('%s never handles a cable with power on', (slug) => {
    let isolated = false
    for (const s of proc(slug).steps) {
      if (s.kind === 'hold' && s.key.startsWith('isolate-power')) isolated = true
      const body = s.body
      const plug = body.search(/\bunplug|plug in\b/i)
      const restore = body.search(/restore power|switch the machine on/i)
      if (plug >= 0) expect(isolated && (restore === -1 || restore > plug), `${slug}/${s.key}`).toBe(true)
      if (restore >= 0) isolated = false
    }
  })

  it('the lock is removed only by the person who fitted it (29 CFR 1910.147(e), release; wording from memory)', () => {
    const restore = proc('spoilboard-resurfacing').steps.find(s => s.key === 'restore-power')!
    expect(restore.body).toMatch(/Remove your own lock/)
    expect(restore.guidance).toMatch(/Only the person who fitted a lock takes it off/)
  })
})

describe('spoilboard resurfacing follows the brief, in order', () => {
  const p = proc('spoilboard-resurfacing')
  // Brief, "Resurfacing the spoilboard": the order of the work.
  it('keeps the order the brief describes', () => {
    const order = [
      'isolate-power', 'clear-bed', 'sensor-disable', 'home', 'fit-vbit', 'xy-zero', 'fit-surfacing-cutter',
      'z-zero', 'plan', 'preview-check', 'start-extraction', 'stay-with-machine', 'run-program', 'check-marks',
      'repeat-pass', 'board-thickness', 'reinstall-sensor', 'sensor-enable', 'final-signoff',
    ].map(k => indexOf(p, k))
    expect(order).toEqual([...order].sort((a, b) => a - b))
    expect(p.steps.at(-1)!.kind).toBe('signoff')
  })

  it('clears sensor, clamps and fences from the bed', () => {
    const clear = p.steps[indexOf(p, 'clear-bed')]!.body
    for (const w of ['sensor', 'clamps', 'fences']) expect(clear).toMatch(new RegExp(w))
  })

  it('sets X/Y zero with a fine-pointed V-bit', () => {
    expect(text(p.steps[indexOf(p, 'fit-vbit')]!)).toMatch(/V-bit with a fine point/)
    expect(p.steps[indexOf(p, 'xy-zero')]!.body).toMatch(/Set X and Y work zero/)
  })

  // Paper-feeler touch-off (common practice, no published source): shrinking jog steps, then Z = paper
  // thickness; office paper about 0.1 mm (printing caliper 0.004 in = 0.1016 mm for 80 g/m², read in a printing glossary).
  it('sets Z zero with paper in shrinking jog steps and the paper thickness', () => {
    const body = p.steps[indexOf(p, 'z-zero')]!.body
    const steps = [...body.matchAll(/(\d+(?:\.\d+)?) mm/g)].map(m => Number(m[1]))
    const jog = steps.slice(0, 3)
    expect(jog).toEqual([1, 0.1, 0.01])
    const paper = Number(body.match(/paper thickness, about (\d+(?:\.\d+)?) mm/)?.[1])
    expect(Math.abs(paper - 0.1016)).toBeLessThan(0.01)
  })

  it('attaches a surfacing plan, then checks the preview', () => {
    expect(p.steps[indexOf(p, 'plan')]).toMatchObject({ kind: 'planner', planner: 'surfacing' })
    expect(p.steps[indexOf(p, 'preview-check')]!.body).toMatch(/overhang/)
  })

  it('starts dust collection, chiller and spindle', () => {
    const body = p.steps[indexOf(p, 'start-extraction')]!.body
    expect(body).toMatch(/dust collector/)
    expect(body).toMatch(/chiller/)
    expect(body).toMatch(/spindle/)
  })

  it('asks for a trainer\'s signature at the power and the start-of-cut holds', () => {
    const marked = holds(p).filter(h => h.needsTrainerSignoff).map(h => h.key)
    expect(marked).toEqual(['isolate-power', 'stay-with-machine'])
  })

  it('checks the pencil corner marks and repeats a pass if needed', () => {
    expect(p.steps[indexOf(p, 'corner-marks')]!.body).toMatch(/pencil marks near each corner/)
    expect(indexOf(p, 'corner-marks')).toBeLessThan(indexOf(p, 'z-zero'))
    expect(p.steps[indexOf(p, 'check-marks')]!.body).toMatch(/Every pencil mark must be gone/)
    expect(p.steps[indexOf(p, 'repeat-pass')]!.body).toMatch(/run the program again/)
  })

  // Per-pass depth 0.25–0.5 mm and repeat 0.1–0.2 mm are common practice, no published source.
  it('keeps the depth advice inside common practice', () => {
    expect(p.steps[indexOf(p, 'depth-notice')]!.guidance).toMatch(/quarter to half a millimetre per pass/)
    expect(p.steps[indexOf(p, 'repeat-pass')]!.body).toMatch(/0\.1 to 0\.2 mm/)
  })

  it('records the board thickness as a check with a range in mm', () => {
    const s = p.steps[indexOf(p, 'board-thickness')]!
    expect(s).toMatchObject({ kind: 'check', unit: 'mm' })
    if (s.kind !== 'check') return
    expect(s.min).toBeDefined()
    expect(s.max).toBeDefined()
    expect(s.min!).toBeLessThan(s.max!)
    // A 19 mm (3/4 in) board: 0.75 × 25.4 = 19.05 mm exactly (NBS Circular 572 addendum, 1960); the range tops
    // out just above a new board's thickness.
    expect(s.max!).toBeGreaterThanOrEqual(0.75 * 25.4)
  })

  it('re-installs and re-enables the tool-length sensor', () => {
    expect(p.steps[indexOf(p, 'reinstall-sensor')]!.body).toMatch(/plug in its cable/)
    expect(p.steps[indexOf(p, 'sensor-enable')]!.body).toMatch(/turn the tool-length sensor on/)
  })
})

describe('the other starter procedures', () => {
  it('the tram check records two tilts in mm with a range around zero', () => {
    const checks = proc('spindle-tram-check').steps.filter(s => s.kind === 'check')
    expect(checks.map(c => c.key)).toEqual(['tram-front-back', 'tram-left-right'])
    for (const c of checks) {
      if (c.kind !== 'check') continue
      expect(c.unit).toBe('mm')
      expect(c.min!).toBeLessThan(0)
      expect(c.max!).toBeGreaterThan(0)
      // 0.05 mm over a 150 mm sweep is a tilt of about 0.019°; across a 25 mm cutter that is
      // a step of 25·sin θ ≈ 0.008 mm per pass (tilted cutter: D·sin θ, hand calculation, no published source).
      const theta = Math.atan(c.max! / 150)
      expect(25 * Math.sin(theta)).toBeLessThan(0.01)
    }
    expect(proc('spindle-tram-check').steps.find(s => s.key === 'fit-sweep-arm')!.body).toMatch(/150 mm circle/)
  })

  it('the tool change covers collet, insertion depth, wrenches and tool length', () => {
    const p = proc('tool-change')
    for (const k of ['spindle-stopped', 'clean-collet', 'collet-notice', 'insertion-depth', 'fit-bit', 'wrenches-off', 'measure-tool']) indexOf(p, k)
    expect(indexOf(p, 'spindle-stopped')).toBe(0)
    expect(indexOf(p, 'wrenches-off')).toBeLessThan(indexOf(p, 'measure-tool'))
  })

  it('daily start-up checks the stop is in reach before power-on, and warms the spindle up', () => {
    const p = proc('daily-start-up')
    expect(indexOf(p, 'estop-reachable')).toBeLessThan(indexOf(p, 'power-on'))
    // 29 CFR 1910.213(b)(3): no automatic restart when power comes on.
    expect(p.steps[indexOf(p, 'power-on')]!.body).toMatch(/Nothing may move until you command it/)
    expect(p.steps[indexOf(p, 'warm-up')]).toMatchObject({ kind: 'check', unit: 'min' })
  })

  it('the shutdown parks, cleans by vacuum and isolates power last', () => {
    const p = proc('end-of-day-shutdown')
    expect(indexOf(p, 'dust-clean')).toBeLessThan(indexOf(p, 'clean-machine'))
    expect(p.steps[indexOf(p, 'clean-machine')]!.body).toMatch(/Vacuum/)
    expect(indexOf(p, 'power-off')).toBeGreaterThan(indexOf(p, 'chiller-off'))
    expect(p.steps[indexOf(p, 'power-off')]!.body).toMatch(/main isolator/)
  })

  it('the emergency-stop test checks spindle, axes and no automatic restart (29 CFR 1910.213(b)(3))', () => {
    const p = proc('emergency-stop-test')
    expect(p.steps[indexOf(p, 'spindle-stop-time')]).toMatchObject({ kind: 'check', unit: 's', min: 0 })
    expect(p.steps[indexOf(p, 'axis-stop-test')]!.body).toMatch(/The gantry must stop at once/)
    expect(p.steps[indexOf(p, 'no-restart')]!.body).toMatch(/Nothing may move or start until you reset/)
    expect((p.steps[indexOf(p, 'failed-stop')] as HoldStep).avoid).toMatch(/tag the machine out of service/)
  })

  it('every procedure that runs a program keeps someone with the machine (common practice, no published source)', () => {
    for (const slug of ['spoilboard-resurfacing', 'stock-flattening']) {
      const p = proc(slug)
      expect(indexOf(p, 'stay-with-machine')).toBeLessThan(p.steps.findIndex(s => /^(Run|Face) /.test(s.title)))
    }
  })
})
