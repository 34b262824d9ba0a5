import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import UiMessage from '~/components/ui/UiMessage'

// The screens' language layer (composables/i18n.ts) with the real locale files: the plural form
// a count picks, a key nobody wrote, a language that does not exist, and
// elements placed in a message's placeholders. The texts compared are the locale files' own.
describe('useI18n', () => {
  afterEach(async () => { await useI18n().setLocale('en') })

  it('reads the screen language, picks the plural form by count and fills placeholders', async () => {
    const { t, setLocale, locale } = useI18n()
    expect(t('sync.photosWaiting', { n: 1 }, 1)).toBe('1 photo waiting')
    expect(t('sync.photosWaiting', { n: 3 }, 3)).toBe('3 photos waiting')
    // No values: the count fills {n} itself (as vue-i18n's t does).
    expect(t('sync.photosWaiting', 0)).toBe('0 photos waiting')
    await setLocale('es')
    expect(locale.value).toBe('es')
    expect(t('sync.photosWaiting', { n: 2 }, 2)).toBe('2 fotos pendientes')
  })

  it('shows a key nobody wrote as itself, and te tells it is missing', async () => {
    const { t, te } = useI18n()
    expect(t('no.such.key')).toBe('no.such.key')
    expect(te('no.such.key')).toBe(false)
    expect(te('sync.photosWaiting')).toBe(true)
  })

  it('keeps the language when asked for one that has no file', async () => {
    const { setLocale, locale } = useI18n()
    await setLocale('xx')
    expect(locale.value).toBe('en')
  })

  it('puts elements in a message\'s placeholders (UiMessage)', async () => {
    const w = await mountSuspended(defineComponent(() => () => h(UiMessage, { keypath: 'floor.running', tag: 'p', class: 'x' }, {
      who: () => h('strong', 'Ana'),
      what: () => h('em', 'Resurfacing'),
    })))
    expect(w.html()).toContain('<p class="x"><strong>Ana</strong> is running <em>Resurfacing</em></p>')
    await useI18n().setLocale('es')
    await w.vm.$nextTick()
    expect(w.find('p').text()).toBe('Ana está haciendo Resurfacing')
  })
})
