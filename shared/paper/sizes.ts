// Paper for printed procedure sheets and where a run came from. One list each, read by the
// database enum, the zod schemas and the screens.

export const PAPER_SIZES = ['a4', 'letter'] as const
export type PaperSize = typeof PAPER_SIZES[number]

export const PAPER_SIZE_LABELS: Record<PaperSize, string> = {
  a4: 'A4 (210 × 297 mm)',
  letter: 'Letter (8.5 × 11 in)',
}

/** Page size in PDF points (1 pt = 1/72 in; 1 in = 25.4 mm exactly). */
export const PAPER_POINTS: Record<PaperSize, { width: number, height: number }> = {
  // ISO 216: A4 = 210 × 297 mm
  a4: { width: 210 / 25.4 * 72, height: 297 / 25.4 * 72 },
  // ANSI/ASME Y14.1 size A, US Letter: 8.5 × 11 in
  letter: { width: 8.5 * 72, height: 11 * 72 },
}

/** A run recorded on a tablet, or done on a printed sheet and entered afterwards. */
export const RUN_ORIGINS = ['tablet', 'paper'] as const
export type RunOrigin = typeof RUN_ORIGINS[number]
