import { describe, expect, it } from 'vitest'
import {
  describeRange, parseProcedure, ProcedureStepSchema, rangeStatus, stepFromRow, stepToRow, SUPPLEMENT_NOTICE,
  type ProcedureInput,
} from '../../../shared/procedures/schema'
import { STARTER_LIBRARY } from '../../../shared/procedures/starter-library'
import { longSentence, plainTextProblem, reasonProblem, sentences } from '../../../shared/procedures/text'

// Validation of procedure versions. The rules are Jogwise's own (issue 3); what is checked here
// is that every bad input is refused with the field's path and a sentence that names the field.

const minimal = (): ProcedureInput => ({
  title: 'Check the dust shoe',
  summary: 'A short check of the dust shoe before work.',
  category: 'daily',
  steps: [
    { key: 'look', kind: 'instruction', title: 'Look at the brushes', body: 'Check the brushes are whole.' },
    {
      key: 'pinch', kind: 'hold', title: 'Mind the magnets', body: 'The shoe snaps on hard.',
      signalWord: 'CAUTION', hazard: 'The magnets can pinch fingers.', avoid: 'Hold the shoe by its sides.',
    },
    { key: 'gap', kind: 'check', title: 'Measure the brush gap', body: 'Measure the gap.', label: 'Brush gap', unit: 'mm', min: 0, max: 3 },
    { key: 'done', kind: 'signoff', title: 'Sign off', body: 'Sign if true.', statement: 'The dust shoe is ready for work.' },
  ],
})

type Mutate = (p: any) => void

describe('parseProcedure', () => {
  it('accepts a valid procedure and fills in the defaults', () => {
    const r = parseProcedure(minimal())
    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(r.procedure.supplementNotice).toBe(SUPPLEMENT_NOTICE)
    expect(r.procedure.steps[0]!.guidance).toBe('')
    expect(r.procedure.steps[1]).toMatchObject({ kind: 'hold', needsTrainerSignoff: false })
  })

  it('trims text fields', () => {
    const p = minimal()
    p.title = '  Check the dust shoe  '
    const r = parseProcedure(p)
    expect(r.ok && r.procedure.title).toBe('Check the dust shoe')
  })

  it.each<[string, Mutate, string, RegExp]>([
    ['a missing title', p => { delete p.title }, 'title', /^Procedure title is required\.$/],
    ['a title of two letters', p => { p.title = 'ab' }, 'title', /Procedure title needs at least 3 characters/],
    ['a title that is a number', p => { p.title = 42 }, 'title', /Procedure title must be text/],
    ['an HTML summary', p => { p.summary = 'Check <b>everything</b> twice please' }, 'summary', /Summary must be plain text without HTML tags/],
    ['an unknown category', p => { p.category = 'misc' }, 'category', /Category must be one of surfacing, setup, maintenance, daily, safety/],
    ['no steps', p => { p.steps = [] }, 'steps', /at least one step/],
    ['steps that are not a list', p => { p.steps = 'one' }, 'steps', /Steps must be a list/],
    ['a step without a kind', p => { delete p.steps[0].kind }, 'steps.0.kind', /Step kind must be one of instruction, hold, check, photo, planner, signoff/],
    ['an unknown step kind', p => { p.steps[0].kind = 'video' }, 'steps.0.kind', /Step kind must be one of/],
    ['an upper-case key', p => { p.steps[0].key = 'Look' }, 'steps.0.key', /lower-case letters, digits and single hyphens/],
    ['a key with a double hyphen', p => { p.steps[0].key = 'look--here' }, 'steps.0.key', /single hyphens/],
    ['a duplicate key', p => { p.steps[2].key = 'look' }, 'steps.2.key', /Step key "look" is already used by step 1/],
    ['an empty body', p => { p.steps[0].body = '   ' }, 'steps.0.body', /Step text is required/],
    ['a long sentence in a body', p => { p.steps[0].body = `Check ${'the brush '.repeat(16)}now.` }, 'steps.0.body', /Step text: sentence 1 has 34 words; keep sentences to 30 words or fewer/],
    ['a hold without a signal word', p => { delete p.steps[1].signalWord }, 'steps.1.signalWord', /Signal word must be one of DANGER, WARNING, CAUTION, NOTICE/],
    ['a made-up signal word', p => { p.steps[1].signalWord = 'ALERT' }, 'steps.1.signalWord', /Signal word must be one of/],
    ['a hold without a hazard statement', p => { delete p.steps[1].hazard }, 'steps.1.hazard', /Hazard statement is required/],
    ['a hold with a thin avoid statement', p => { p.steps[1].avoid = 'Be safe' }, 'steps.1.avoid', /How to avoid the hazard needs at least 10 characters/],
    ['a sign-off flag that is not true or false', p => { p.steps[1].needsTrainerSignoff = 'yes' }, 'steps.1.needsTrainerSignoff', /true or false/],
    ['a check without a unit', p => { delete p.steps[2].unit }, 'steps.2.unit', /Unit is required/],
    ['a check range upside down', p => { p.steps[2].min = 5; p.steps[2].max = 1 }, 'steps.2.max', /Highest allowed value must not be less than the lowest/],
    ['a check bound that is text', p => { p.steps[2].min = '1' }, 'steps.2.min', /Lowest allowed value must be a number/],
    ['a check bound that is infinite', p => { p.steps[2].max = Number.POSITIVE_INFINITY }, 'steps.2.max', /Highest allowed value must be a finite number/],
    ['a photo step without a subject', p => { p.steps[0] = { key: 'pic', kind: 'photo', title: 'Photo', body: 'Take one.' } }, 'steps.0.subject', /What to photograph is required/],
    ['a planner step for another planner', p => { p.steps[0] = { key: 'pl', kind: 'planner', title: 'Plan', body: 'Plan it.', planner: 'pocket' } }, 'steps.0.planner', /Planner must be "surfacing"/],
    ['a sign-off without a statement', p => { delete p.steps[3].statement }, 'steps.3.statement', /Sign-off statement is required/],
    ['a sign-off that is not last', p => { p.steps.splice(1, 0, { ...p.steps[3], key: 'early' }) }, 'steps.1.kind', /A sign-off step must be the last step/],
    ['no sign-off at the end', p => { p.steps.pop() }, 'steps', /The last step must be a sign-off step/],
    ['a blank supplement notice', p => { p.supplementNotice = '' }, 'supplementNotice', /Supplement notice/],
    ['control characters in guidance', p => { p.steps[0].guidance = 'Look\u0007 closely' }, 'steps.0.guidance', /Guidance contains control characters/],
  ])('refuses %s with the field path and a named reason', (_name, mutate, path, message) => {
    const p = structuredClone(minimal())
    mutate(p)
    const r = parseProcedure(p)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.issues).toContainEqual({ path, message: expect.stringMatching(message) })
  })

  it('reports a duplicate key in the same pass as other mistakes', () => {
    const p: any = structuredClone(minimal())
    p.steps[2].key = 'look'
    p.title = ''
    const r = parseProcedure(p)
    expect(r.ok ? [] : r.issues.map(i => i.path)).toEqual(expect.arrayContaining(['title', 'steps.2.key']))
  })

  it('refuses something that is not an object with one plain sentence', () => {
    expect(parseProcedure(null)).toEqual({ ok: false, issues: [{ path: '', message: 'A procedure must be an object with a title, summary, category and steps.' }] })
  })
})

describe('text rules', () => {
  it.each<[string, string | null]>([
    ['Lock and tag the isolator.', null],
    ['Use <script>alert(1)</script>', 'must be plain text without HTML tags'],
    ['Keep 3 < 5 and 7 > 2 in mind', null], // comparison signs are not tags
    ['Bell\u0007 character', 'contains control characters'],
  ])('plainTextProblem(%j) is %j', (text, problem) => {
    expect(plainTextProblem(text)).toBe(problem)
  })

  it.each<[string, string[]]>([
    ['One. Two! Three?', ['One.', 'Two!', 'Three?']],
    ['Set Z to 0.1 mm. Then stop.', ['Set Z to 0.1 mm.', 'Then stop.']],
    ['Line one\nLine two', ['Line one', 'Line two']],
    ['', []],
  ])('sentences(%j)', (text, expected) => {
    expect(sentences(text)).toEqual(expected)
  })

  it('longSentence finds the first sentence over the limit', () => {
    expect(longSentence('Short one. ' + 'word '.repeat(31).trim() + '.')).toEqual({ position: 2, words: 31 })
    expect(longSentence('word '.repeat(30))).toBeNull()
  })

  it.each<[string | undefined, boolean]>([
    [undefined, false],
    ['', false],
    ['ok', false],
    ['n/a n/a n/a', false],
    ['xxxxxxxxxxxxxxx', false],
    ['aa aa aa aa aa', false],
    ['checked', false],
    ['Plug in my hand, machine unplugged', true],
    ['Sensor cable cut; replaced it first', true],
    ['Le capteur est déjà retiré', true], // reasons in any language with letters
  ])('reasonProblem(%j) accepts: %s', (text, ok) => {
    expect(reasonProblem(text) === null).toBe(ok)
  })
})

describe('check ranges', () => {
  // Inclusive bounds: a reading equal to a bound is in range.
  it.each<[number | undefined, number | undefined, number, 'below' | 'above' | null]>([
    [12, 19.5, 12, null], [12, 19.5, 19.5, null], [12, 19.5, 11.999, 'below'], [12, 19.5, 19.501, 'above'],
    [-0.05, 0.05, -0.05, null], [-0.05, 0.05, -0.06, 'below'], [undefined, 10, -1e9, null], [0, undefined, 1e9, null],
    [undefined, undefined, 42, null],
  ])('min %s, max %s: %s is %s', (min, max, v, side) => {
    expect(rangeStatus({ min, max }, v)).toBe(side)
  })

  it.each<[number | undefined, number | undefined, string | null]>([
    [12, 19.5, '12 to 19.5 mm'], [5, undefined, 'at least 5 mm'], [undefined, 10, 'at most 10 mm'], [undefined, undefined, null],
  ])('describeRange(%s, %s) is %j', (min, max, text) => {
    expect(describeRange({ min, max, unit: 'mm' })).toBe(text)
  })
})

describe('stored step rows', () => {
  const allSteps = STARTER_LIBRARY.flatMap(p => p.steps.map(s => ProcedureStepSchema.parse(s)))
  it.each(allSteps.map(s => [s.key, s.kind, s] as const))('%s (%s) survives a trip through its row', (_k, _kind, step) => {
    const row = stepToRow(step)
    expect(Object.keys(row).sort()).toEqual(['body', 'guidance', 'key', 'kind', 'settings', 'title'])
    expect(stepFromRow(structuredClone(row))).toEqual({ ok: true, step })
  })

  it('reports a stored row whose settings went bad', () => {
    const row = stepToRow(ProcedureStepSchema.parse(minimal().steps[1]))
    row.settings = { ...row.settings, signalWord: 'DANGEROUS' }
    expect(stepFromRow(row)).toEqual({ ok: false, issues: [{ path: 'signalWord', message: 'Signal word must be one of DANGER, WARNING, CAUTION, NOTICE.' }] })
  })
})
