/** API response shapes for sign-off, evidence, certificate verification and the stocking plan. */
import type { Verdict } from '../cycle/types'
import type { CanonicalValues } from '../readings/entry'
import type { AcclimationSettings, DatedAcclimationStep, FinalValue, StockingStep } from '../sign-off/plan'
import type { CyclePhase, TankStatus, TankView } from './tanks'

import type { CycleMethod, SignOffStatus, StageStatus } from '../vocabulary'

export type { SignOffStatus } from '../vocabulary'

/** A build-plan stage as it stood at the decision. */
export interface SignedStage {
  key: string
  title: string
  status: StageStatus
  completedAt: string | null
}

/** The tank as it stood at the decision: everything a certificate prints comes from here. */
export interface SignedTankFacts {
  company: string
  tankName: string
  clientName: string
  siteLabel: string | null
  shape: string
  dimensions: Record<string, number | undefined>
  volumeLitres: number
  sumpLitres: number
  cycleMethod: CycleMethod
  cycleStartedAt: string | null
  aquaristName: string | null
  /** Who made the decision. */
  supervisorName: string
  stages: SignedStage[]
}

/** A change to a signed tank's facts made without reopening: audited, and printed on the certificate. */
export interface SignOffAmendmentView {
  at: string
  byName: string | null
  reason: string
  changes: { field: string, before: unknown, after: unknown }[]
}

/**
 * What the engine answered when the supervisor decided, and the tank as it stood. What the
 * engine was given (every test and event, megabytes for an imported history) is kept beside it
 * in `sign_off_inputs`, read only where it is needed (the certificate's final tests, the lock).
 */
export interface SignOffSnapshot {
  /** Absent only on sign-offs decided before the facts were kept with the decision. */
  facts?: SignedTankFacts
  verdict: Verdict
  /** Why approving was against the verdict; empty when the engine agreed. */
  overrideGrounds: string[]
  /** Unresolved danger alerts at decision time. */
  unresolvedAlerts: number
  /**
   * The tank's lighting acclimation at decision time (its lighting-ramp stage). Absent on
   * records signed before it was kept: those were printed with Tidewright's defaults.
   */
  acclimation?: AcclimationSettings
}

export interface SignOffRecord {
  id: string
  status: SignOffStatus
  requestedAt: string
  requestedByName: string | null
  requestNote: string | null
  decidedAt: string | null
  decidedByName: string | null
  decisionNote: string | null
  /** Approved against the engine's verdict, with `decisionNote` as the written reason. */
  override: boolean
  ruleSetVersion: string | null
  reopenedAt: string | null
  reopenedByName: string | null
  reopenReason: string | null
  /** The code printed on the certificate; null until approved. */
  verificationCode: string | null
}

export interface SignOffRecordWithSnapshot extends SignOffRecord {
  snapshot: SignOffSnapshot | null
}

/** One row of the supervisor's review queue. */
export interface ReviewItem {
  signOffId: string
  tankId: string
  tankName: string
  clientName: string
  supervisorName: string | null
  requestedAt: string
  requestedByName: string | null
  requestNote: string | null
  phase: CyclePhase | null
  daysCycling: number | null
  openAlerts: number
  /** Why approving now would go against the stored verdict; empty when the engine agrees. */
  overrideGrounds: string[]
}

export interface StockingPlanView {
  signedAt: string
  steps: StockingStep[]
  lighting: DatedAcclimationStep[]
}

/** The sign-off state shown on the tank page. */
export interface SignOffState {
  tankStatus: TankStatus
  phase: CyclePhase
  current: SignOffRecord | null
  history: SignOffRecord[]
  /** Why an approval now would be an override; empty when the engine agrees. */
  overrideGrounds: string[]
  lockedUntil: string | null
  canRequest: boolean
  canDecide: boolean
  canReopen: boolean
  canStartStocking: boolean
  hasCertificate: boolean
  plan: StockingPlanView | null
}

export interface EvidenceReading extends CanonicalValues {
  id: string
  takenAt: string
  enteredByName: string | null
  notes: string | null
  correctsId: string | null
  correctionReason: string | null
  /** A later correction replaces this row. */
  correctedById: string | null
  createdAt: string
}

export interface EvidenceEvent {
  id: string
  at: string
  kind: string
  amount: number | null
  group: string | null
  notes: string | null
  enteredByName: string | null
  correctsId: string | null
  correctionReason: string | null
  correctedById: string | null
}

export interface EvidenceStage {
  id: string
  position: number
  key: string
  title: string
  status: string
  skipReason: string | null
  notes: string | null
  checklist: { id: string, label: string, done: boolean, doneByName: string | null, doneAt: string | null }[]
  completedByName: string | null
  completedAt: string | null
}

export interface EvidenceUpload {
  id: string
  stageId: string | null
  readingId: string | null
  mimeType: string
  sizeBytes: number
  originalName: string
  /** An image preview exists at /api/uploads/:id/thumbnail; the file itself is /api/uploads/:id. */
  hasThumbnail: boolean
  uploadedByName: string | null
  createdAt: string
}

export interface EvidenceAlert {
  id: string
  kind: string
  status: string
  message: string
  openedAt: string
  acknowledgedAt: string | null
  acknowledgeNote: string | null
  resolvedAt: string | null
  resolveNote: string | null
}

/** Everything a supervisor reviews before deciding. */
export interface Evidence {
  tank: TankView
  verdict: Verdict
  evaluatedAt: string
  overrideGrounds: string[]
  /** Readings and events come a page at a time: page 1 holds the newest `pageSize` of each, oldest first. */
  page: number
  pageSize: number
  readingsTotal: number
  eventsTotal: number
  readings: EvidenceReading[]
  events: EvidenceEvent[]
  stages: EvidenceStage[]
  uploads: EvidenceUpload[]
  alerts: EvidenceAlert[]
  signOffs: SignOffRecordWithSnapshot[]
  /** Readings and events at or before this time are locked by the sign-off; null when none stands. */
  lockedUntil: string | null
  canDecide: boolean
  canReopen: boolean
}

/** The public answer for a verification code: minimal facts only. */
export interface VerifyResult {
  valid: boolean
  status: 'approved' | 'reopened'
  tankName: string
  company: string
  signedAt: string
  supervisorName: string | null
  reopenedAt: string | null
}

export type { FinalValue }
