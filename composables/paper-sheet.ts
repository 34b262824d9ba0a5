import regularUrl from '@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-normal.woff?url'
import boldUrl from '@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-700-normal.woff?url'
import type { ProcedureCategory, ProcedureStep, SignalWord } from '#shared/procedures'
import type { PaperSize } from '#shared/paper/sizes'
import type { SheetWords } from '#shared/paper/procedure-sheet'

// Makes a procedure's printed sheet in the browser, so it prints with no network: the PDF
// code is a chunk of the app and the fonts are the app's own woff2 files, both precached by the
// service worker. Loaded on first use only (pdf-lib is large). The sheet prints in the reader's
// language: its own words from the `paper.sheet` section, the steps as the version's
// translation has them (the original where a step is not translated).

export interface SheetVersion { procedureId: number, title: string, version: number, summary: string, category: string, steps: ProcedureStep[] }

const SIGNALS: SignalWord[] = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE']

export function usePaperSheet() {
  const { t, te } = useI18n()
  const rangeText = useRangeText()
  async function makeSheet(v: SheetVersion, paperSize: PaperSize, shopName?: string): Promise<Blob> {
    const [{ procedureSheetPdf, SHEET_WORDS }, { procedureUrl }, regular, bold] = await Promise.all([
      import('#shared/paper/procedure-sheet'),
      import('#shared/paper/tag-url'),
      fetch(regularUrl).then(r => r.arrayBuffer()),
      fetch(boldUrl).then(r => r.arrayBuffer()),
    ])
    const words = Object.fromEntries(Object.keys(SHEET_WORDS).map(k => [k, t(`paper.sheet.${k}`)])) as SheetWords
    const bytes = await procedureSheetPdf({
      title: v.title, version: v.version, category: v.category as ProcedureCategory, summary: v.summary,
      supplementNotice: t('editor.supplement'), steps: v.steps, paperSize, printedAt: new Date(),
      url: procedureUrl(window.location.origin, v.procedureId), shopName,
      words, signalWords: Object.fromEntries(SIGNALS.map(w => [w, t(`signal.${w}`)])),
      categoryLabel: te(`categories.${v.category}`) ? t(`categories.${v.category}`) : v.category, rangeText,
    }, { regular, bold })
    return new Blob([bytes as BlobPart], { type: 'application/pdf' })
  }
  return { makeSheet }
}
