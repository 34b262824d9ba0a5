// Length, feed and surface-speed units for the machining arithmetic.
// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959); never 39.37 in/m.

export type LengthUnit = 'mm' | 'in'
export type SurfaceSpeedUnit = 'm/min' | 'SFM'

export const MM_PER_INCH = 25.4
export const M_PER_FOOT = 0.3048
export const MM3_PER_IN3 = 16387.064

/** Decimals shown to people, per unit (a hundredth of a mm, a ten-thousandth of an inch). */
export const LENGTH_DECIMALS: Record<LengthUnit, number> = { mm: 2, in: 4 }
/** Feeds: whole mm/min, tenths of in/min. */
export const FEED_DECIMALS: Record<LengthUnit, number> = { mm: 0, in: 1 }
export const SURFACE_SPEED_DECIMALS: Record<SurfaceSpeedUnit, number> = { 'm/min': 1, 'SFM': 0 }

export function toMm(value: number, unit: LengthUnit): number {
  return unit === 'mm' ? value : value * MM_PER_INCH
}

export function fromMm(mm: number, unit: LengthUnit): number {
  return unit === 'mm' ? mm : mm / MM_PER_INCH
}

export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  return from === to ? value : fromMm(toMm(value, from), to)
}

/** mm/min <-> in/min: a feed is a length per minute, so the length factor applies. */
export function convertFeed(value: number, from: LengthUnit, to: LengthUnit): number {
  return convertLength(value, from, to)
}

/** mm^3 <-> in^3 (1 in^3 = 16 387.064 mm^3 exactly). */
export function convertVolume(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value
  return from === 'in' ? value * MM3_PER_IN3 : value / MM3_PER_IN3
}

export function sfmToMetersPerMinute(sfm: number): number {
  return sfm * M_PER_FOOT
}

export function metersPerMinuteToSfm(mpm: number): number {
  return mpm / M_PER_FOOT
}

export function convertSurfaceSpeed(value: number, from: SurfaceSpeedUnit, to: SurfaceSpeedUnit): number {
  if (from === to) return value
  return from === 'SFM' ? sfmToMetersPerMinute(value) : metersPerMinuteToSfm(value)
}

/** The surface-speed unit that goes with a length unit (metric m/min, inch SFM). */
export function surfaceSpeedUnitFor(unit: LengthUnit): SurfaceSpeedUnit {
  return unit === 'mm' ? 'm/min' : 'SFM'
}

/** Fixed decimals without the "-0.00" that toFixed gives for tiny negatives. */
export function formatNumber(value: number, decimals: number): string {
  const text = value.toFixed(decimals)
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text
}

export function formatLength(value: number, unit: LengthUnit, decimals = LENGTH_DECIMALS[unit]): string {
  return `${formatNumber(value, decimals)} ${unit}`
}

export function formatFeed(value: number, unit: LengthUnit, decimals = FEED_DECIMALS[unit]): string {
  return `${formatNumber(value, decimals)} ${unit}/min`
}

export function formatSurfaceSpeed(value: number, unit: SurfaceSpeedUnit): string {
  return `${formatNumber(value, SURFACE_SPEED_DECIMALS[unit])} ${unit}`
}

/** Volume in cm^3 for metric plans (easier to picture than mm^3), in^3 for inch plans. */
export function formatVolume(value: number, unit: LengthUnit): string {
  return unit === 'mm' ? `${formatNumber(value / 1000, 1)} cm³` : `${formatNumber(value, 2)} in³`
}

/** "1 h 02 min", "4 min 56 s" or "12 s"; rounded to whole seconds. */
export function formatDuration(seconds: number): string {
  const total = Math.max(0, Math.round(seconds))
  const h = Math.floor(total / 3600)
  const min = Math.floor((total % 3600) / 60)
  const s = total % 60
  if (h > 0) return `${h} h ${String(min).padStart(2, '0')} min`
  if (min > 0) return `${min} min ${s} s`
  return `${s} s`
}
