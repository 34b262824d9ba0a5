import regularUrl from '@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-normal.woff?url'
import boldUrl from '@fontsource/atkinson-hyperlegible/files/atkinson-hyperlegible-latin-700-normal.woff?url'
import type { ProcedureCategory, ProcedureStep } from '#shared/procedures'
import type { PaperSize } from '#shared/paper/sizes'

// Makes a procedure's printed sheet in the browser, so it prints with no network: the PDF
// code is a chunk of the app and the fonts are the app's own woff2 files, both precached by the
// service worker. Loaded on first use only (pdf-lib is large).

export interface SheetVersion { procedureId: number, title: string, version: number, summary: string, category: string, steps: ProcedureStep[] }

export function usePaperSheet() {
  async function makeSheet(v: SheetVersion, paperSize: PaperSize, shopName?: string): Promise<Blob> {
    const [{ procedureSheetPdf }, { SUPPLEMENT_NOTICE }, { procedureUrl }, regular, bold] = await Promise.all([
      import('#shared/paper/procedure-sheet'),
      import('#shared/procedures/schema'),
      import('#shared/paper/tag-url'),
      fetch(regularUrl).then(r => r.arrayBuffer()),
      fetch(boldUrl).then(r => r.arrayBuffer()),
    ])
    const bytes = await procedureSheetPdf({
      title: v.title, version: v.version, category: v.category as ProcedureCategory, summary: v.summary,
      supplementNotice: SUPPLEMENT_NOTICE, steps: v.steps, paperSize, printedAt: new Date(),
      url: procedureUrl(window.location.origin, v.procedureId), shopName,
    }, { regular, bold })
    return new Blob([bytes as BlobPart], { type: 'application/pdf' })
  }
  return { makeSheet }
}
