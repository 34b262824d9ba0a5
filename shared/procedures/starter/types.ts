import type { ProcedureCategory, ProcedureStepInput } from '../schema'

export interface StarterProcedure {
  /** Stable id for seeding, so re-seeding a shop updates instead of duplicating. */
  slug: string
  title: string
  summary: string
  category: ProcedureCategory
  supplementNotice: string
  steps: ProcedureStepInput[]
}
