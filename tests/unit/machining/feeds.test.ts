import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  chipLoadFromFeed, computeFeeds, feedFromChipLoad, materialRemovalRate, rpmFromSurfaceSpeed,
  surfaceSpeedFromRpm,
} from '../../../shared/machining/feeds'
import { metersPerMinuteToSfm } from '../../../shared/machining/units'

describe('spindle speed from surface speed (Machinery\'s Handbook cutting speed formulas)', () => {
  it.each([
    // metric n = 1000 Vc / (pi D): Machinery's Handbook (read in secondary copies); values published
    // by two online spindle-speed calculators (read there)
    { v: 100, d: 10, unit: 'mm', rpm: 3183.0989, status: 'published calculator value 3183.10' },
    { v: 120, d: 20, unit: 'mm', rpm: 1909.8593, status: 'published calculator value 1909.86' },
    // inch N = 12 V / (pi D): Machinery's Handbook, Cutting Speed Formulas (formula read in secondary
    // copies; section name from memory)
    { v: 100, d: 0.5, unit: 'in', rpm: 763.9437, status: 'hand calculation (the 4V/D shortcut would say 800)' },
    // Machinery's Handbook, Cutting Speed Formulas, Example 1: 4 in bar at 575 fpm -> 549 rpm;
    // wording from memory, arithmetic by hand calculation
    { v: 575, d: 4, unit: 'in', rpm: 549.0846, status: 'handbook example from memory, hand-calculated arithmetic' },
  ] as const)('$v per min at D $d $unit -> $rpm rpm [$status]', ({ v, d, unit, rpm }) => {
    expect(rpmFromSurfaceSpeed(v, d, unit)).toBeCloseTo(rpm, 4)
  })

  it('the handbook\'s Example 1 rounds to the published 549 rpm (from memory)', () => {
    expect(Math.round(rpmFromSurfaceSpeed(575, 4, 'in'))).toBe(549)
  })

  it.each([
    // Hand-calculated vectors from V = π·D·N/12 and Vc = π·D·n/1000 (Machinery's Handbook)
    { rpm: 18000, d: 6.35, unit: 'mm', v: 359.0840 },
    { rpm: 12000, d: 25.4, unit: 'mm', v: 957.5574 },
    { rpm: 18000, d: 0.25, unit: 'in', v: 1178.0972 },
    { rpm: 12000, d: 1, unit: 'in', v: 3141.5927 },
  ] as const)('$rpm rpm at D $d $unit -> surface speed $v [hand calculation]', ({ rpm, d, unit, v }) => {
    expect(surfaceSpeedFromRpm(rpm, d, unit)).toBeCloseTo(v, 4)
  })

  it('18000 rpm on a 6.35 mm cutter is 359.0840 m/min = 1178.0972 SFM (hand calculation)', () => {
    expect(metersPerMinuteToSfm(surfaceSpeedFromRpm(18000, 6.35, 'mm'))).toBeCloseTo(1178.0972, 4)
  })

  // Property tests: n(Vc(D, n)) = n, and a change of units leaves rpm unchanged.
  it('inverts exactly and gives the same rpm in inch and metric units', () => {
    fc.assert(fc.property(
      fc.double({ min: 100, max: 60000, noNaN: true }),
      fc.double({ min: 0.5, max: 100, noNaN: true }),
      (rpm, dMm) => {
        const vc = surfaceSpeedFromRpm(rpm, dMm, 'mm')
        expect(rpmFromSurfaceSpeed(vc, dMm, 'mm')).toBeCloseTo(rpm, 6)
        const sfm = metersPerMinuteToSfm(vc)
        expect(rpmFromSurfaceSpeed(sfm, dMm / 25.4, 'in') / rpm).toBeCloseTo(1, 12)
      },
    ))
  })
})

describe('feed, chip load and removal rate (Machinery\'s Handbook feeds for milling, MRR = F·W·t)', () => {
  it.each([
    // v_f = f_z z n: Machinery's Handbook, feeds for milling, and US Army TC 9-524 (1996), App. C
    // (read in secondary copies; the appendix from memory); vector by hand calculation
    { chip: 0.1, flutes: 2, rpm: 18000, feed: 3600, status: 'hand calculation' },
    // New Concepts in Milling Handbook (1973), "Selecting Feed in Chip Load per Tooth":
    // 0.004 in x 32 teeth x 88 rpm = 11.264 (published 11.2)
    { chip: 0.004, flutes: 32, rpm: 88, feed: 11.264, status: 'published example, 11.2' },
  ])('$chip per tooth x $flutes x $rpm rpm = $feed per min [$status]', ({ chip, flutes, rpm, feed }) => {
    expect(feedFromChipLoad(chip, flutes, rpm)).toBeCloseTo(feed, 9)
    expect(chipLoadFromFeed(feed, flutes, rpm)).toBeCloseTo(chip, 12)
  })

  it('MRR = width x depth x feed: 20 mm x 0.5 mm x 3000 mm/min = 30 cm³/min (Machinery\'s Handbook MRR formula; hand calculation)', () => {
    expect(materialRemovalRate(20, 0.5, 3000)).toBeCloseTo(30000, 9)
  })

  // Property: vf / (z n) = fz.
  it('recovers the chip load from the feed it gives', () => {
    fc.assert(fc.property(
      fc.double({ min: 0.001, max: 1, noNaN: true }),
      fc.integer({ min: 1, max: 16 }),
      fc.double({ min: 100, max: 60000, noNaN: true }),
      (fz, z, n) => {
        expect(chipLoadFromFeed(feedFromChipLoad(fz, z, n), z, n) / fz).toBeCloseTo(1, 12)
      },
    ))
  })

  it.each([
    [() => rpmFromSurfaceSpeed(0, 10, 'mm'), 'Surface speed must be a finite number greater than zero (got 0)'],
    [() => surfaceSpeedFromRpm(1000, -1, 'mm'), 'Diameter must be a finite number greater than zero (got -1)'],
    [() => feedFromChipLoad(0.1, 2, Number.NaN), 'Spindle speed must be a finite number greater than zero (got NaN)'],
    [() => materialRemovalRate(1, 0, 1), 'Depth of cut must be a finite number greater than zero (got 0)'],
  ])('refuses bad arguments with a clear message (%#)', (fn, message) => {
    expect(fn).toThrow(message)
  })
})

describe('the Feeds screen calculation', () => {
  it('fills in surface speed, feed and removal rate from rpm and chip load (hand-calculated vectors)', () => {
    const r = computeFeeds({ units: 'mm', diameter: 6.35, flutes: 2, rpm: 18000, chipLoad: 0.1, widthOfCut: 20, depthOfCut: 0.5 })
    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(r.feeds.surfaceSpeed).toBeCloseTo(359.0840, 4)
    expect(r.feeds.surfaceSpeedUnit).toBe('m/min')
    expect(r.feeds.feed).toBeCloseTo(3600, 9)
    expect(r.feeds.removalRate).toBeCloseTo(20 * 0.5 * 3600, 6)
  })

  it('works back from surface speed and feed in inches (handbook Example 1 and the 1973 milling handbook feed)', () => {
    const r = computeFeeds({ units: 'in', diameter: 4, flutes: 32, surfaceSpeed: 575, feed: 11.264 })
    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(r.feeds.rpm).toBeCloseTo(549.0846, 4)
    expect(r.feeds.surfaceSpeedUnit).toBe('SFM')
    expect(r.feeds.chipLoad).toBeCloseTo(11.264 / (32 * 549.0846), 8)
    expect(r.feeds.removalRate).toBeNull()
  })

  it.each([
    [{ units: 'mm', diameter: 6, flutes: 2 }, 'rpm', 'Give either the spindle speed or the surface speed, not both or neither.'],
    [{ units: 'mm', diameter: 6, flutes: 2, rpm: 1, surfaceSpeed: 1 }, 'rpm', 'Give either the spindle speed or the surface speed, not both or neither.'],
    [{ units: 'mm', diameter: 6, flutes: 2, rpm: 1, chipLoad: 0.1, feed: 100 }, 'feed', 'Give either the chip load or the feed, not both.'],
    [{ units: 'mm', diameter: 6, flutes: 2, rpm: 1, widthOfCut: 3 }, 'depthOfCut', 'Removal rate needs both the width and the depth of cut.'],
    [{ units: 'cm', diameter: 6, flutes: 2, rpm: 1 }, 'units', 'Units must be \'mm\' or \'in\'.'],
    [{ units: 'mm', diameter: 0, flutes: 2, rpm: 1 }, 'diameter', 'Cutter diameter must be greater than zero.'],
    [{ units: 'mm', diameter: 6, flutes: 2.5, rpm: 1 }, 'flutes', 'Flutes must be a whole number.'],
    [{ units: 'mm', diameter: 6, flutes: 2, rpm: -5 }, 'rpm', 'Spindle speed must be greater than zero.'],
  ])('rejects %j at %s', (input, path, message) => {
    const r = computeFeeds(input)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.issues).toContainEqual({ path, message })
  })
})

describe('Feeds input bounds (common practice, no published source)', () => {
  const ok = { units: 'mm', diameter: 6, flutes: 2, rpm: 18000, chipLoad: 0.05 } as const
  it.each([
    ['diameter', { diameter: 1e-9 }, 'Cutter diameter must be at least 0.1 mm.'],
    ['diameter', { diameter: 1e6 }, 'Cutter diameter must be at most 150 mm.'],
    ['rpm', { rpm: 1e9 }, 'Spindle speed must be at most 60000 rpm.'],
    ['chipLoad', { chipLoad: 50 }, 'Chip load must be at most 5 mm.'],
    ['feed', { chipLoad: undefined, feed: 1e9 }, 'Feed must be at most 100000 mm/min.'],
    ['diameter', { units: 'in', diameter: 10 }, 'Cutter diameter must be at most 5.906 in.'],
    ['surfaceSpeed', { units: 'in', rpm: undefined, surfaceSpeed: 1e6 }, 'Surface speed must be at most 16000 SFM.'],
  ])('%s: %j', (path, over, message) => {
    const r = computeFeeds({ ...ok, ...over })
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.issues).toContainEqual({ path, message })
  })
  it('accepts the sensible case', () => {
    expect(computeFeeds(ok).ok).toBe(true)
  })
})
