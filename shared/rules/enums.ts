// Every fixed list of choices, written once: the Drizzle schema (mysqlEnum) and the zod input
// schemas both read them from here. Roles live in shared/types/roles.ts and ledger kinds in
// shared/runs/ledger-kinds.ts, for the same reason.

/** Lengths are stored in mm; a person or machine may read and type them in inches. */
export const UNITS = ['mm', 'in'] as const
export type Units = typeof UNITS[number]

export const SPINDLE_KINDS = ['trim-router', 'air-spindle', 'water-spindle'] as const
export type SpindleKind = typeof SPINDLE_KINDS[number]

/**
 * How the control reads the P word of G4: seconds as NIST RS274/NGC (NISTIR 6556) says, or
 * milliseconds as some controls do.
 */
export const DWELL_UNITS = ['seconds', 'milliseconds'] as const
export type DwellUnit = typeof DWELL_UNITS[number]

export const TOOL_KINDS = ['surfacing', 'straight', 'spiral-up', 'spiral-down', 'compression', 'ball-nose', 'v-bit', 'other'] as const
export type ToolKind = typeof TOOL_KINDS[number]

/** Where a run stands, as the runs table keeps it for lists and the due list. */
export const RUN_STATUSES = ['active', 'finished', 'abandoned', 'withdrawn'] as const
export type RunStatus = typeof RUN_STATUSES[number]

/** Guided (a trainer signs the holds that need it) or solo (a qualified person alone). */
export const RUN_MODES = ['guided', 'solo'] as const
export type RunMode = typeof RUN_MODES[number]

/** A spoilboard reading: surface heights from the probe, or thicknesses from calipers. */
export const BOARD_READING_KINDS = ['height', 'thickness'] as const
export type BoardReadingKind = typeof BOARD_READING_KINDS[number]
