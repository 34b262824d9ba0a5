import { describe, expect, it } from 'vitest'
import { translateIssues, translateText, type MessageTree } from '../../../shared/i18n/translate'
import en from '../../../i18n/locales/en.json'
import es from '../../../i18n/locales/es.json'
import { InviteAcceptSchema, InviteCreateSchema, InviteJoinFormSchema } from '../../../shared/schemas/invite'
import { toIssues } from '../../../shared/schemas/issues'
import { PaperRunSchema } from '../../../shared/schemas/paper-run'
import { ProcedurePublishSchema } from '../../../shared/schemas/procedure'
import { ShopSettingsSchema } from '../../../shared/schemas/shop'
import { UserCreateSchema, UserPatchSchema } from '../../../shared/schemas/user'
import type { z } from 'zod'

// The crew, invite, paper-run and Library messages in Spanish: the messages are the ones the
// real schemas write (not copies), put through the `errors` templates the server's error hook
// and the tablet use (shared/i18n/translate.ts).

const EN = en.errors as unknown as MessageTree
const ES = es.errors as unknown as MessageTree
const issuesOf = (schema: z.ZodType, input: unknown) => {
  const parsed = schema.safeParse(input)
  expect(parsed.success).toBe(false)
  return toIssues(parsed.error!)
}
const spanish = (schema: z.ZodType, input: unknown) => translateIssues(issuesOf(schema, input), EN, ES)

describe('crew and invite messages in Spanish', () => {
  it('adding a person: every field issue is translated and keeps its path', () => {
    const issues = spanish(UserCreateSchema, { name: '', email: 'not-an-address', role: 'boss', password: 'short', pin: '12' })
    expect(Object.fromEntries(issues.map(i => [i.path, i.message]))).toEqual({
      name: 'Escribe un nombre.',
      email: 'Escribe un correo válido.',
      role: 'Rol: tiene que ser uno de estos: owner, trainer, operator, trainee.',
      password: 'Usa al menos 10 caracteres para la contraseña.',
      pin: 'Un PIN tiene de 4 a 8 cifras.',
    })
  })

  it('changing a person', () => {
    expect(spanish(UserPatchSchema, {}).map(i => i.message)).toEqual(['No hay nada que cambiar.'])
    expect(spanish(UserPatchSchema, { active: 'yes' }).map(i => i.message)).toEqual(['Activo: tiene que ser verdadero o falso.'])
    expect(spanish(UserPatchSchema, { name: 'x'.repeat(121) }).map(i => i.message)).toEqual(['El nombre no puede pasar de 120 caracteres.'])
  })

  it('the join form and the invite link', () => {
    const join = spanish(InviteJoinFormSchema, { name: '', password: 'a-long-password', confirm: 'another-password' })
    expect(join).toEqual([
      { path: 'name', message: 'Escribe tu nombre.' },
      { path: 'confirm', message: 'Las dos contraseñas no coinciden; escribe la misma dos veces.' },
    ])
    expect(spanish(InviteAcceptSchema, { token: 'short', name: 'Ana', password: 'a-long-password' }))
      .toEqual([{ path: 'token', message: 'Este enlace de invitación está incompleto; vuelve a abrir el enlace del correo.' }])
    expect(spanish(InviteCreateSchema, { email: 'ana@example.test', role: 'operator', language: 'Spanish' }))
      .toEqual([{ path: 'language', message: 'El idioma tiene que ser un código de dos o tres letras, como «es».' }])
  })

  it('the invite routes\' own refusals', () => {
    expect(translateText('This invite has expired. Ask the owner to send a new one.', EN, ES)).toBe('Esta invitación ha caducado. Pide al dueño que envíe una nueva.')
    expect(translateText('email: That address already has a pending invite. Withdraw it first to send a new one.', EN, ES))
      .toBe('email: Esa dirección ya tiene una invitación pendiente. Retírala primero para enviar otra.')
    expect(translateText('Jogwise has no fr screens; choose one of en, es.', EN, ES)).toBe('Jogwise no tiene pantallas en fr; elige uno de en, es.')
  })
})

describe('Library and paper messages in Spanish', () => {
  it('publishing a procedure whose steps break the rules', () => {
    const issues = spanish(ProcedurePublishSchema, {
      procedure: {
        title: 'Check the collet', summary: 'Check the collet nut before a job.', category: 'setup',
        steps: [
          { key: 'Bad Key', kind: 'instruction', title: 'Look', body: 'Look at the collet.' },
          { key: 'range', kind: 'check', title: 'Runout', body: 'Measure the runout.', label: 'Runout', unit: 'mm', min: 0.05, max: 0.01 },
        ],
      },
      changeNote: 'x'.repeat(501),
    })
    const by = Object.fromEntries(issues.map(i => [i.path, i.message]))
    expect(by['procedure.steps.0.key']).toBe('La clave del paso solo puede llevar minúsculas, cifras y guiones sueltos (por ejemplo «isolate-power»).')
    expect(by['procedure.steps.1.max']).toBe('El valor máximo permitido no puede ser menor que el mínimo permitido.')
    expect(by['procedure.steps']).toBe('El último paso tiene que ser de firma, para que cada trabajo termine con alguien confirmando lo hecho.')
    expect(by.changeNote).toBe('La nota de cambios no puede pasar de 500 caracteres.')
  })

  it('entering a paper run with nothing chosen', () => {
    const issues = spanish(PaperRunSchema, {
      runId: 'not-a-uuid', mode: 'alone', startedAt: '2026-03-01T08:15:00Z', finishedAt: '2026-03-01T08:00:00Z',
      outcome: 'stopped', stopReason: '', ticked: ['a', 'a'], readings: [],
    })
    const by = Object.fromEntries(issues.map(i => [i.path, i.message]))
    expect(by).toMatchObject({
      runId: 'El id del trabajo tiene que ser un UUID hecho por el formulario.',
      machineId: 'Máquina: hay que elegirlo.',
      operatorId: 'Quién hizo el trabajo: hay que elegirlo.',
      mode: 'El modo tiene que ser guiado o solo.',
    })
  })

  it('paper-run checks against the shop\'s rows and the sheet\'s steps', () => {
    expect(translateText('Started at is before Bench Router was added to Jogwise (2026-01-05).', EN, ES))
      .toBe('El inicio es anterior a cuando Bench Router se añadió a Jogwise (2026-01-05).')
    expect(translateText('step 3 "Spindle brake time" has no reading; enter it, or record the run as stopped.', EN, ES))
      .toBe('el paso 3 «Spindle brake time» no tiene lectura; anótala, o registra el trabajo como parado.')
    expect(translateText('12 s is outside 0 to 10 s; the reason is required.', EN, ES)).toBe('12 s está fuera de 0 to 10 s; el motivo es obligatorio.')
  })

  it('the shop\'s paper setting', () => {
    expect(spanish(ShopSettingsSchema, { paperSize: 'a3' }).map(i => i.message)).toEqual(['Tamaño de papel: tiene que ser uno de a4, letter.'])
  })
})

describe('every message these schemas write has a Spanish template', () => {
  // A bad value for each field: whatever the schema answers must not stay in English.
  it.each([
    ['UserCreateSchema', UserCreateSchema, { name: 5, email: 5, role: 5, password: 5, pin: 5 }],
    ['InviteCreateSchema', InviteCreateSchema, { email: '', role: '' }],
    ['InviteJoinFormSchema', InviteJoinFormSchema, { name: 'x'.repeat(200), password: 'x'.repeat(201), confirm: '' }],
    ['PaperRunSchema', PaperRunSchema, { runId: 1, machineId: 1.5, procedureVersionId: -1, operatorId: 'x', mode: 1, startedAt: 'x', finishedAt: 'x', outcome: 1, ticked: 'x', readings: 'x', note: 1 }],
  ] as const)('%s', (_name, schema, input) => {
    for (const issue of issuesOf(schema as z.ZodType, input)) {
      expect(translateText(issue.message, EN, ES), `${issue.path}: ${issue.message}`).not.toBe(issue.message)
    }
  })
})
