/**
 * A tank's life as one state machine: which status may follow which, on what trigger and
 * by whom. Pure data and one pure function, so the table can be read and tested on its
 * own; the server's `changeTankStatus` (server/domain/tanks/status.ts) is the only code
 * that writes a tank's status, and it asks this table first.
 *
 *   planned --stage-started--> building --water-filled--> cycling --sign-off-requested--> cycled
 *   cycled --sign-off-approved--> signed-off --stocking-started / livestock-logged--> stocking
 *   cycled --sign-off-returned--> cycling;  signed-off | stocking --sign-off-reopened--> cycling
 */
import type { Role, TankStatus } from '../vocabulary'

/** Who causes a transition: a person in one of these roles, or Tidewright itself reacting to data. */
export type TransitionActor = Role | 'system'

export interface TankTransition {
  /** Statuses the tank may be in for the trigger to apply. */
  from: readonly TankStatus[]
  to: TankStatus
  /** Who may cause it. Finer checks (the tank's own supervisor) stay with the command that triggers it. */
  by: readonly TransitionActor[]
  /** Plain words for the audit trail and for refusals. */
  means: string
}

const STAFF_WHO_BUILD = ['admin', 'aquarist'] as const
const STAFF_WHO_SIGN = ['admin', 'supervisor'] as const

/** Every way a tank's status changes. */
export const TANK_LIFECYCLE = {
  'stage-started': {
    from: ['planned'], to: 'building', by: STAFF_WHO_BUILD,
    means: 'work on the build plan began',
  },
  'water-filled': {
    from: ['planned', 'building'], to: 'cycling', by: STAFF_WHO_BUILD,
    means: 'the tank was filled and the nitrogen cycle started',
  },
  'sign-off-requested': {
    from: ['cycling', 'cycled'], to: 'cycled', by: STAFF_WHO_BUILD,
    means: 'the cycle was put up for sign-off',
  },
  // A waiting request is decided whether the tank is still cycled or was moved back to cycling.
  'sign-off-approved': {
    from: ['cycling', 'cycled'], to: 'signed-off', by: STAFF_WHO_SIGN,
    means: 'the supervisor signed the cycle off',
  },
  'sign-off-returned': {
    from: ['cycling', 'cycled'], to: 'cycling', by: STAFF_WHO_SIGN,
    means: 'the supervisor sent the cycle back',
  },
  'sign-off-reopened': {
    from: ['signed-off', 'stocking'], to: 'cycling', by: STAFF_WHO_SIGN,
    means: 'the sign-off was reopened',
  },
  'stocking-started': {
    from: ['signed-off'], to: 'stocking', by: STAFF_WHO_BUILD,
    means: 'stocking began',
  },
  'livestock-logged': {
    from: ['signed-off'], to: 'stocking', by: ['system'],
    means: 'livestock was logged after the sign-off',
  },
} as const satisfies Record<string, TankTransition>

export type TankTrigger = keyof typeof TANK_LIFECYCLE
export const TANK_TRIGGERS = Object.keys(TANK_LIFECYCLE) as TankTrigger[]

export type TransitionCheck
  = | { ok: true, to: TankStatus }
    | { ok: false, refusal: 'role' | 'status', message: string }

/** Whether `trigger` may move a tank in status `from`, caused by `by`; and if so, to what. */
export function checkTransition(from: TankStatus, trigger: TankTrigger, by: TransitionActor): TransitionCheck {
  const transition: TankTransition = TANK_LIFECYCLE[trigger]
  if (!transition.by.includes(by)) {
    return { ok: false, refusal: 'role', message: `Only ${transition.by.join(' or ')} may record that ${transition.means}` }
  }
  if (!transition.from.includes(from)) {
    return { ok: false, refusal: 'status', message: `A tank that is ${from} cannot move on because ${transition.means}` }
  }
  return { ok: true, to: transition.to }
}

/** Whether `trigger` applies to a tank in this status (whoever causes it). */
export function appliesTo(trigger: TankTrigger, status: TankStatus): boolean {
  return (TANK_LIFECYCLE[trigger].from as readonly TankStatus[]).includes(status)
}

/** The triggers that apply to a tank in this status, in table order. */
export function triggersFrom(status: TankStatus): TankTrigger[] {
  return TANK_TRIGGERS.filter(trigger => appliesTo(trigger, status))
}
