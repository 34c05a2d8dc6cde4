import type { StageView } from '#shared/types/plan'
import type { TankView } from '#shared/types/tanks'

/** What every build-plan stage calculator is given: its stage, the whole plan, the tank, and whether it may save. */
export interface StageHelperProps {
  stage: StageView
  stages: StageView[]
  tank: TankView
  canEdit: boolean
  busy: boolean
}
