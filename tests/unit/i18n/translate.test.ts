import { describe, expect, it } from 'vitest'
import { chooseLanguage, matchTemplate, pickLanguage, translateIssues, translateText, type MessageTree } from '../../../shared/i18n/translate'
import en from '../../../i18n/locales/en.json'
import es from '../../../i18n/locales/es.json'
import { parseProcedure } from '../../../shared/procedures'

// Server and zod messages are written in English and put into the reader's language at the
// boundary (server/plugins/error-language.ts, composables/error-text.ts) with the templates of
// each locale file's `errors` section.

const EN = en.errors as unknown as MessageTree
const ES = es.errors as unknown as MessageTree

describe('translateText', () => {
  it('rewrites a fixed message', () => {
    expect(translateText('Sign in first.', EN, ES)).toBe('Primero entra con tu cuenta.')
  })

  it('keeps the values of a template', () => {
    expect(translateText('This needs the owner or trainer role; you are signed in as trainee.', EN, ES))
      .toBe('Esto necesita el rol owner or trainer; has entrado como trainee.')
  })

  it('translates a label inside a message too', () => {
    expect(translateText('Step title is required.', EN, ES)).toBe('Título del paso: campo obligatorio.')
  })

  it('translates a reason inside a reason', () => {
    expect(translateText('The reason is too short: write at least 8 characters saying why.', EN, ES))
      .toBe('El motivo: es demasiado corto; escribe al menos 8 caracteres diciendo por qué.')
  })

  it('keeps a field path in front of a message', () => {
    expect(translateText('steps.3.title: Step title is required.', EN, ES)).toBe('steps.3.title: Título del paso: campo obligatorio.')
  })

  it('translates zod\'s own English', () => {
    expect(translateText('Invalid input: expected number, received string', EN, ES)).toBe('Dato no válido: se esperaba number y llegó string')
  })

  it('translates a Ledger summary with its optional tails', async () => {
    const { ledgerSummary } = await import('../../../shared/schemas/ledger')
    expect(translateText(ledgerSummary('hold-acknowledged', { signalWord: 'WARNING', lang: 'es' }), EN, ES))
      .toBe('Confirmó la parada de ADVERTENCIA. Texto en pantalla: es.')
    expect(translateText(ledgerSummary('hold-acknowledged', { signalWord: 'NOTICE' }), EN, ES)).toBe('Confirmó la parada de AVISO.')
    expect(translateText(ledgerSummary('signed-off', { stepTitle: 'Sign off', signerRole: 'trainer', lang: 'es', notCounted: 'Undone by the person who made it.' }), EN, ES))
      .toBe('Firmó «Sign off» como formador. Texto en pantalla: es. No cuenta: Undone by the person who made it.')
  })

  it('leaves a message nobody translated as it is', () => {
    expect(translateText('Something nobody wrote a template for.', EN, ES)).toBe('Something nobody wrote a template for.')
    expect(matchTemplate('Something nobody wrote a template for.', EN)).toBeUndefined()
  })

  it('changes nothing for English readers', () => {
    expect(translateText('Sign in first.', EN, EN)).toBe('Sign in first.')
  })

  it('translates the issues of a real schema and keeps their paths', () => {
    const result = parseProcedure({ title: 'Ok title', summary: 'A summary long enough.', category: 'daily', steps: [{ key: 'a', kind: 'instruction', title: '', body: 'Do it.' }] })
    expect(result.ok).toBe(false)
    if (result.ok) return
    const out = translateIssues(result.issues, EN, ES)
    expect(out.map(i => i.path)).toEqual(result.issues.map(i => i.path))
    expect(out.find(i => i.path === 'steps.0.title')?.message).toBe('Título del paso: necesita al menos 3 caracteres.')
  })
})

describe('pickLanguage (Accept-Language, RFC 9110 §12.5.4)', () => {
  const supported = ['en', 'es']
  it('takes the first supported language by weight', () => {
    expect(pickLanguage('es-MX,es;q=0.9,en;q=0.8', supported)).toBe('es')
    expect(pickLanguage('fr-CA,fr;q=0.9,en;q=0.5,es;q=0.7', supported)).toBe('es')
  })
  it('falls back to English for none, a wildcard or an unknown language', () => {
    expect(pickLanguage(undefined, supported)).toBe('en')
    expect(pickLanguage('*', supported)).toBe('en')
    expect(pickLanguage('de-DE', supported)).toBe('en')
  })
  it('ignores a language refused with q=0', () => {
    expect(pickLanguage('es;q=0, en', supported)).toBe('en')
  })
})

describe('messages of the Board, Machines, Cutters, Feeds, Planner and due intervals', () => {
  // Issues made by the real schemas, so a message reworded without its template fails here.
  const firstIssue = (result: { success: boolean, error?: { issues: { path: PropertyKey[], message: string }[] } }, path: string) =>
    result.error?.issues.find(i => i.path.join('.') === path)?.message ?? ''

  it('translates a machine\'s field issues, labels included', async () => {
    const { MachineCreateSchema } = await import('../../../shared/schemas/machine')
    const r = MachineCreateSchema.safeParse({ name: 'A', units: 'mm', travelXMm: 0.5, travelYMm: 600, travelZMm: 90, spindleKind: 'trim-router', hasLengthSensor: true, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 20 })
    expect(translateText(firstIssue(r, 'travelXMm'), EN, ES)).toBe('Recorrido en X: debe ser al menos 1 mm.')
    expect(translateText(firstIssue(r, 'spoilboardMinMm'), EN, ES)).toBe('El espesor mínimo tiene que ser menor que el espesor nominal.')
  })

  it('translates a cutter\'s issues and the route\'s own refusals', async () => {
    const { ToolCreateSchema } = await import('../../../shared/schemas/tool')
    const r = ToolCreateSchema.safeParse({ name: 'A', kind: 'surfacing', diameterMm: 10, flutes: 20, cornerRadiusMm: 0, maxRpm: 500 })
    expect(translateText(firstIssue(r, 'flutes'), EN, ES)).toBe('Más de 16 filos no es una fresa de router.')
    expect(translateText(firstIssue(r, 'maxRpm'), EN, ES)).toBe('Velocidad máxima: debe ser al menos 1000 rpm.')
    // server/api/tools/[id].patch.ts and notFound('cutter')
    expect(translateText('The corner radius cannot be more than half the diameter.', EN, ES)).toBe('El radio de esquina no puede pasar de la mitad del diámetro.')
    expect(translateText('No such cutter.', EN, ES)).toBe('No existe: fresa.')
  })

  it('translates a board reading\'s cell issues with their row and column', async () => {
    const { ReadingBodySchema } = await import('../../../shared/schemas/board')
    const r = ReadingBodySchema.safeParse({ kind: 'thickness', units: 'mm', grid: [[18, 'x'], [18, 0]], spacing: { x: 100, y: 100 } })
    expect(translateText(firstIssue(r, 'grid.0.1'), EN, ES)).toBe('La lectura de la fila 1, columna 2, no es un número.')
    // server/api/machines/[id]/readings.post.ts
    expect(translateText('Big Table is retired; bring it back before logging readings.', EN, ES)).toBe('Big Table está dada de baja; recupérala antes de apuntar lecturas.')
    expect(translateText('The body names machine 3 but the address names machine 4.', EN, ES)).toBe('El cuerpo nombra la máquina 3 pero la dirección nombra la máquina 4.')
  })

  it('translates the Planner\'s and the Feeds screen\'s checks', async () => {
    const { SurfacingInputSchema, FeedsInputSchema } = await import('../../../shared/machining')
    const plan = SurfacingInputSchema.safeParse({ units: 'mm', area: { x: 600, y: 600 }, cutter: { diameter: 25, flutes: 2 }, stepoverPct: 50, totalDepth: 1, depthPerPass: 20, feed: 2500, plunge: 500, rpm: 16000, direction: 'x', pattern: 'zigzag', safeZ: 5 })
    expect(translateText(firstIssue(plan, 'depthPerPass'), EN, ES))
      .toBe('Profundidad por pasada: 20.00 mm pasa de la mitad del diámetro de la fresa (12.50 mm); es demasiado hondo para una pasada.')
    const feeds = FeedsInputSchema.safeParse({ units: 'mm', diameter: 10, flutes: 2, rpm: 18000, widthOfCut: 5 })
    expect(translateText(firstIssue(feeds, 'depthOfCut'), EN, ES)).toBe('El caudal de viruta necesita el ancho y la profundidad de corte.')
  })

  it('translates a maintenance interval\'s issues', async () => {
    const { IntervalCreateSchema } = await import('../../../shared/schemas/maintenance')
    const r = IntervalCreateSchema.safeParse({ procedureId: 1, everyDays: null, everySpindleHours: null })
    expect(translateText(firstIssue(r, 'everyDays'), EN, ES)).toBe('Pon un número de días, de horas de husillo o los dos.')
    const long = IntervalCreateSchema.safeParse({ procedureId: 1, everyDays: 4000 })
    expect(translateText(firstIssue(long, 'everyDays'), EN, ES)).toBe('Días: como mucho 3650 (diez años).')
  })
})

describe('chooseLanguage (the server\'s answers and the screens\' first render)', () => {
  // Jogwise's own order, no outside source: the person's profile, the tablet's cookie, then the
  // browser's Accept-Language; anything not a language file is passed over.
  const supported = ['en', 'es']
  it('takes the profile before the cookie and the cookie before the browser', () => {
    expect(chooseLanguage(supported, { chosen: 'es', cookie: 'en', acceptLanguage: 'en' })).toBe('es')
    expect(chooseLanguage(supported, { chosen: null, cookie: 'es', acceptLanguage: 'en' })).toBe('es')
    expect(chooseLanguage(supported, { acceptLanguage: 'es-MX,es;q=0.9' })).toBe('es')
  })
  it('passes over a profile or cookie language with no file, and falls back to English', () => {
    expect(chooseLanguage(supported, { chosen: 'xx', cookie: 'zz', acceptLanguage: 'es' })).toBe('es')
    expect(chooseLanguage(supported, { chosen: 'xx', cookie: 'zz' })).toBe('en')
  })
})
