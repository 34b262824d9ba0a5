import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  convertFeed, convertLength, convertSurfaceSpeed, convertVolume, formatDuration, formatFeed,
  formatLength, formatNumber, formatSurfaceSpeed, formatVolume, fromMm, metersPerMinuteToSfm,
  sfmToMetersPerMinute, toMm,
} from '../../../shared/machining/units'

describe('exact inch conversions', () => {
  // NBS Circular 572 addendum (1960) / NIST SP 811: 1 in = 25.4 mm exactly;
  // decimal examples by hand calculation (exact decimal arithmetic).
  it.each([
    [1, 25.4],
    [0.25, 6.35],
    [0.004, 0.1016],
    [1 / 64, 0.396875],
    [24, 609.6],
    [48, 1219.2],
  ])('%d in = %d mm', (inches, mm) => {
    expect(toMm(inches, 'in')).toBeCloseTo(mm, 12)
    expect(fromMm(mm, 'in')).toBeCloseTo(inches, 12)
    expect(convertLength(inches, 'in', 'mm')).toBeCloseTo(mm, 12)
  })

  it('uses 25.4, not the pre-1959 39.37 in/m (NBS Circular 572 addendum, 1960)', () => {
    // 1000 mm is 39.370078... in under the 1959 definition, not 39.37.
    expect(fromMm(1000, 'in')).toBeCloseTo(39.37007874015748, 12)
    expect(Math.abs(fromMm(1000, 'in') - 39.37)).toBeGreaterThan(1e-5)
  })

  // Hand calculation from 1 in = 25.4 mm exactly: 1 ft = 0.3048 m, 1 in/min = 25.4 mm/min, 1 in³ = 16.387064 cm³.
  it.each([
    ['1000 SFM = 304.8 m/min (hand calculation)', sfmToMetersPerMinute(1000), 304.8],
    ['1 SFM = 0.3048 m/min', sfmToMetersPerMinute(1), 0.3048],
    ['304.8 m/min = 1000 SFM', metersPerMinuteToSfm(304.8), 1000],
    ['100 in/min = 2540 mm/min', convertFeed(100, 'in', 'mm'), 2540],
    ['1 in³ = 16387.064 mm³', convertVolume(1, 'in', 'mm'), 16387.064],
    ['7.68 in³ = 125.85 cm³ (worked plan, inch variant)', convertVolume(7.68, 'in', 'mm') / 1000, 125.8526515],
  ])('%s', (_label, value, expected) => {
    expect(value).toBeCloseTo(expected, 6)
  })

  // With binary floats the round trip holds to 1e-12 relative (our tolerance, common practice, no published source).
  it('round-trips lengths, feeds, volumes and surface speeds within 1e-12 relative', () => {
    fc.assert(fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (v) => {
      expect(Math.abs(convertLength(convertLength(v, 'mm', 'in'), 'in', 'mm') - v) / v).toBeLessThan(1e-12)
      expect(Math.abs(convertFeed(convertFeed(v, 'in', 'mm'), 'mm', 'in') - v) / v).toBeLessThan(1e-12)
      expect(Math.abs(convertVolume(convertVolume(v, 'mm', 'in'), 'in', 'mm') - v) / v).toBeLessThan(1e-12)
      expect(Math.abs(convertSurfaceSpeed(convertSurfaceSpeed(v, 'SFM', 'm/min'), 'm/min', 'SFM') - v) / v).toBeLessThan(1e-12)
    }))
  })
})

describe('formatting with sensible precision', () => {
  // Jogwise display rules: lengths mm 2 / in 4 decimals, feeds mm/min 0 / in/min 1.
  it.each([
    [formatLength(12.7, 'mm'), '12.70 mm'],
    [formatLength(0.5, 'in'), '0.5000 in'],
    [formatLength(-0.0000001, 'mm'), '0.00 mm'],
    [formatFeed(3000, 'mm'), '3000 mm/min'],
    [formatFeed(118.11, 'in'), '118.1 in/min'],
    [formatSurfaceSpeed(957.5574, 'm/min'), '957.6 m/min'],
    [formatSurfaceSpeed(3141.5927, 'SFM'), '3142 SFM'],
    [formatVolume(120000, 'mm'), '120.0 cm³'],
    [formatVolume(7.68, 'in'), '7.68 in³'],
    [formatNumber(-0.0004, 3), '0.000'],
    [formatDuration(296), '4 min 56 s'],
    [formatDuration(12.4), '12 s'],
    [formatDuration(3725), '1 h 02 min'],
  ])('gives %s', (actual, expected) => {
    expect(actual).toBe(expected)
  })
})
