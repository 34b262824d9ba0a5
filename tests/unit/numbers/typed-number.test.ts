import { describe, expect, it } from 'vitest'
import { parseOptionalNumber, parseTypedNumber } from '../../../shared/numbers'

// The decimal separator: ISO 80000-1 (2009, §7.3.2, from memory) allows the point or the comma
// "on the line"; which one a tablet's number pad offers follows its language (CLDR's decimal
// symbol, e.g. "," for es and de, "." for en). Both mean the same here.
describe('parseTypedNumber', () => {
  it.each([
    ['610,5', 610.5],
    ['610.5', 610.5],
    [' 18,0 ', 18],
    ['-0,25', -0.25],
    ['+3', 3],
    [',5', 0.5],
    ['7.', 7],
    ['0', 0],
  ])('reads %j as %d', (text, value) => {
    expect(parseTypedNumber(text)).toBe(value)
  })

  it.each(['', '   ', 'abc', '1,234.5', '1.234,5', '1 234', '0x10', '1e3', 'Infinity', '-', ',', '12mm', '1,2,3'])('refuses %j', (text) => {
    expect(parseTypedNumber(text)).toBeNaN()
  })

  it('passes a number through', () => {
    expect(parseTypedNumber(12.5)).toBe(12.5)
  })
})

describe('parseOptionalNumber', () => {
  it('leaves an empty field out and reads the rest', () => {
    expect(parseOptionalNumber('')).toBeUndefined()
    expect(parseOptionalNumber(null)).toBeUndefined()
    expect(parseOptionalNumber('2,5')).toBe(2.5)
    expect(parseOptionalNumber('x')).toBeNaN()
  })
})
