import type { ListOf } from './list'
import type { AlertStatus } from '../vocabulary'

/** An alert as the API returns it. */
export interface AlertView {
  id: string
  tankId: string
  tankName: string
  aquaristName: string | null
  /** The rule id of the danger finding, e.g. `ammonia.action-threshold`. */
  kind: string
  status: AlertStatus
  message: string
  openedAt: string
  /** Minutes from opening until now, or until it was resolved. */
  ageMinutes: number
  acknowledgedAt: string | null
  acknowledgedByName: string | null
  acknowledgeNote: string | null
  escalatedAt: string | null
  resolvedAt: string | null
  resolveNote: string | null
  openedByReadingId: string | null
  lastReadingId: string | null
}

/** A notice in the user's notification centre. */
export interface NotificationView {
  id: string
  kind: string
  title: string
  body: string
  link: string | null
  alertId: string | null
  createdAt: string
  readAt: string | null
}

export interface NotificationList extends ListOf<NotificationView> {
  unread: number
}
