// Safety wording of the starter library that a careful shop foreman checks for. Sources named
// per check: OSHA 29 CFR 1910.147 (control of hazardous energy: lockout/tagout), ANSI Z535.4
// (signal words), and the practice stated in the check itself where no published source exists.
import { describe, expect, it } from 'vitest'
import { PLANNER_SAFETY_LINE, starterProcedure } from '../../../shared/procedures/starter-library'
import type { ProcedureStepInput } from '../../../shared/procedures/schema'

const step = (slug: string, key: string) => {
  const s = starterProcedure(slug)!.steps.find(x => x.key === key)
  expect(s, `${slug} / ${key}`).toBeDefined()
  return s as ProcedureStepInput & { body: string, guidance: string, hazard?: string, avoid?: string, signalWord?: string }
}
const all = (s: ReturnType<typeof step>) => [s.title, s.body, s.guidance, s.hazard ?? '', s.avoid ?? ''].join(' ')
const keys = (slug: string) => starterProcedure(slug)!.steps.map(s => s.key)

describe('starter library safety wording', () => {
  it('holds before surfacing for the cutter\'s maximum rpm and tight insert screws (WARNING: a cutter can break apart)', () => {
    for (const slug of ['spoilboard-resurfacing', 'stock-flattening']) {
      const hold = step(slug, 'cutter-rating')
      expect(hold.kind).toBe('hold')
      // ANSI Z535.4: WARNING where death or serious injury could result.
      expect(hold.signalWord).toBe('WARNING')
      expect(all(hold)).toMatch(/maximum speed|rated speed/)
      expect(all(hold)).toMatch(/insert screw/)
      expect(keys(slug).indexOf('cutter-rating')).toBeLessThan(keys(slug).indexOf('start-extraction'))
    }
  })

  it('keeps the spindle off while fingers are near the cutter at the X/Y and Z zero steps (common practice, no published source)', () => {
    for (const [slug, key] of [['spoilboard-resurfacing', 'xy-zero'], ['spoilboard-resurfacing', 'z-zero'], ['stock-flattening', 'xy-zero'], ['stock-flattening', 'z-zero']]) {
      expect(step(slug!, key!).body, `${slug} / ${key}`).toMatch(/^Keep the spindle off/)
    }
  })

  it('lockout: control back to off after the start test, lights out is no proof, plug under exclusive control, warn before power returns (OSHA 29 CFR 1910.147)', () => {
    const lock = all(step('spoilboard-resurfacing', 'isolate-power'))
    // 1910.147(d)(6): verify isolation, then return operating controls to neutral or off.
    expect(lock).toMatch(/prove nothing moves, then return the control to off/)
    // 1910.147(d)(5): stored energy must be relieved; a dark indicator is not verification.
    expect(lock).toMatch(/drive lights going out is not proof/)
    expect(lock).toMatch(/discharge time the drive's manual gives/)
    // 1910.147(a)(2)(iii)(A): cord-and-plug equipment, plug under the exclusive control of the worker.
    expect(lock).toMatch(/under your own control, where only you can plug it back in/)
    // 1910.147(e)(2): affected employees are notified before power is restored.
    expect(step('spoilboard-resurfacing', 'restore-power').body).toMatch(/Tell the people nearby that power is coming back/)
    expect(step('spoilboard-resurfacing', 'reinstall-sensor').body).toMatch(/Tell the people nearby that power is coming back/)
  })

  it('reads marks left in one area as a low board against the XY plane, and ridges between passes as tram, as the tram check does', () => {
    const marks = `${step('spoilboard-resurfacing', 'corner-marks').guidance} ${step('spoilboard-resurfacing', 'repeat-pass').guidance}`
    expect(marks).toMatch(/low there compared with the (plane the machine's X and Y motion cuts|machine's XY plane)/)
    expect(marks).not.toMatch(/corner usually means .* out of tram/)
    expect(marks).toMatch(/steps or ridges between neighbouring passes .* out of tram, tilted in the stepover direction/)
    // The tram procedure's own words: tilt in the stepover direction leaves a step between passes.
    expect(step('spindle-tram-check', 'why-tram').guidance).toMatch(/Tilt in the stepover direction leaves a small step between neighbouring passes/)
  })

  it('the Planner footer carries the signal word the library gives the same hazards (ANSI Z535.4)', () => {
    expect(PLANNER_SAFETY_LINE.signalWord).toBe(step('spoilboard-resurfacing', 'stay-with-machine').signalWord)
    expect(PLANNER_SAFETY_LINE.signalWord).toBe(step('spoilboard-resurfacing', 'protective-gear').signalWord)
    expect(PLANNER_SAFETY_LINE.text).toMatch(/stay at the machine/)
    expect(PLANNER_SAFETY_LINE.text).toMatch(/eye, hearing and dust protection/)
  })

  it('a failed e-stop test leaves the repair to a qualified person and electrical faults to a licensed electrician; no empty collet is tightened', () => {
    const failed = all(step('emergency-stop-test', 'failed-stop'))
    expect(failed).toMatch(/qualified person/)
    expect(failed).toMatch(/licensed electrician/)
    const test = all(step('emergency-stop-test', 'test-hazard'))
    expect(test).toMatch(/do not tighten the collet nut on an empty collet/)
    for (const s of starterProcedure('emergency-stop-test')!.steps) {
      expect(all(s as ReturnType<typeof step>)).not.toMatch(/\btighten the (collet|nut)\b(?! nut on an empty collet)/i)
    }
  })
})
