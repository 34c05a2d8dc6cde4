import type { StageView } from '#shared/types/plan'
import type { TankView } from '#shared/types/tanks'
import type { FieldSpec } from '~/utils/field-specs'

/** What every build-plan stage calculator is given: its stage, the whole plan, the tank, and whether it may save. */
export interface StageHelperProps {
  stage: StageView
  stages: StageView[]
  tank: TankView
  canEdit: boolean
  busy: boolean
}

/**
 * A stage calculator's form as data, for `<PlanHelperPanel>`: its title, its fields in a grid
 * (bound to `values`, the calculator's own reactive form), and its save button's words and action.
 */
export interface StageHelperForm {
  title: string
  fields?: readonly FieldSpec[]
  values?: object
  /** The fields' grid columns as Tailwind classes (`grid-cols-2 sm:grid-cols-3`). */
  columns?: string
  /** The save button's words and what it does; a calculator without them only computes. */
  saveLabel?: string
  save?: () => void
}
