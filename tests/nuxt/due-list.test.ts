import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import DueList from '~/components/due/DueList.vue'
import { dueStatusOf, type DueItem, type IntervalFacts } from '~~/server/utils/due-list'

// The due list writes each reason in the reader's language from the facts the server sends.
// In English it must read exactly as the server's own sentence (used by mail and CSV).
const now = new Date('2026-12-03T12:00:00Z')
const daysAgo = (n: number) => new Date(now.getTime() - n * 86_400_000)

function item(f: IntervalFacts): DueItem {
  const s = dueStatusOf(f, now)
  return {
    intervalId: 1, procedureId: 1, procedureTitle: 'Spindle tram check', machineId: 1, machineName: 'Bench Router',
    status: s.status, reason: s.reason, daysSince: s.daysSince, lastDoneAt: f.lastDoneAt?.toISOString() ?? null, dueAt: s.dueAt?.toISOString() ?? null,
    spindleHoursSince: f.everySpindleHours ? f.spindleHoursSince : null, everyDays: f.everyDays, everySpindleHours: f.everySpindleHours,
  }
}

const CASES: IntervalFacts[] = [
  { everyDays: 7, everySpindleHours: null, lastDoneAt: null, addedAt: null, spindleHoursSince: 0 },
  { everyDays: 7, everySpindleHours: 40, lastDoneAt: null, addedAt: null, spindleHoursSince: 0 },
  { everyDays: 30, everySpindleHours: null, lastDoneAt: daysAgo(1), spindleHoursSince: 0 },
  { everyDays: 30, everySpindleHours: null, lastDoneAt: daysAgo(12), spindleHoursSince: 0 },
  { everyDays: 10, everySpindleHours: null, lastDoneAt: null, addedAt: daysAgo(0), spindleHoursSince: 0 },
  { everyDays: null, everySpindleHours: 5, lastDoneAt: null, addedAt: daysAgo(3), spindleHoursSince: 0 },
  { everyDays: null, everySpindleHours: 40, lastDoneAt: daysAgo(3), spindleHoursSince: 12.34 },
  { everyDays: 90, everySpindleHours: 200, lastDoneAt: daysAgo(95), spindleHoursSince: 201.5 },
]

async function reasons(lang: 'en' | 'es', items: DueItem[]) {
  await useI18n().setLocale(lang)
  const wrapper = await mountSuspended(DueList, { props: { items, showOk: true } })
  return wrapper.findAll('[data-testid=due-reason]').map(p => p.text())
}

describe('DueList reasons', () => {
  afterEach(async () => { await useI18n().setLocale('en') })

  it('reads in English exactly as the server\'s sentence', async () => {
    const items = CASES.map(item)
    expect(await reasons('en', items)).toEqual(items.map(i => i.reason))
  })

  it('reads in Spanish with the decimal comma and the right plural', async () => {
    const [never, both, , twelve, , , hours] = await reasons('es', CASES.map(item))
    expect(never).toBe('Sin hacer nunca; cada 7 días.')
    expect(both).toBe('Sin hacer nunca; cada 7 días o cada 40 horas de husillo.')
    expect(twelve).toBe('Hecho por última vez hace 12 días, cada 30 días.')
    expect(hours).toBe('12,3 de 40 horas de husillo usadas.')
  })
})
