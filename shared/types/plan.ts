/** API response shapes for a tank's build plan. */
import type { StageStatus } from '../vocabulary'

export type { StageStatus } from '../vocabulary'

export interface ChecklistItemView {
  id: string
  label: string
  done: boolean
  doneBy: string | null
  doneByName: string | null
  doneAt: string | null
}

export interface UploadView {
  id: string
  mimeType: string
  sizeBytes: number
  originalName: string
  hasThumbnail: boolean
  uploadedByName: string | null
  /** Who added it: only they may remove it. */
  uploadedById: string | null
  createdAt: string
}

export interface StageView {
  id: string
  position: number
  key: string
  title: string
  status: StageStatus
  skipReason: string | null
  checklist: ChecklistItemView[]
  notes: string | null
  data: Record<string, unknown>
  completedBy: string | null
  completedByName: string | null
  completedAt: string | null
  updatedAt: string
  uploads: UploadView[]
}

export interface PlanView {
  tankId: string
  /** True when the user may tick, note and upload. */
  canEdit: boolean
  stages: StageView[]
}

export interface PlanTemplateView {
  /** True when the company still uses Tidewright's default plan. */
  isDefault: boolean
  stages: { key: string, title: string, checklist: string[] }[]
}

/** PATCH /api/tanks/:id/stages/:stageId body as the plan components send it. */
export interface StagePatchBody {
  status?: StageStatus
  skipReason?: string | null
  checklist?: { id: string, done: boolean }[]
  notes?: string | null
  data?: Record<string, unknown>
}
