import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { Role, UnitSystem } from '#shared/vocabulary'

/** The signed-in person as the session describes them (filled from the database on every session read). */
export interface SignedInPerson {
  id: string
  name: string
  role: Role
  units: UnitSystem
  /** The company's clock (IANA time zone) for every date and time shown. */
  timeZone: string
}

/** Who may do what in the interface; the server checks every request again. */
const TANK_MANAGERS: readonly Role[] = ['admin', 'aquarist']
const TEST_ENTRY: readonly Role[] = ['admin', 'aquarist', 'client']

/**
 * The signed-in person and their preferences, for every page and component: who they are, what
 * their role lets them see, and the unit system they read and type in. The session is the
 * source (the `me` plugin keeps this store in step with it); pages ask the store instead of
 * repeating role lists.
 */
export const useMeStore = defineStore('me', () => {
  const person = ref<SignedInPerson | null>(null)

  const signedIn = computed(() => person.value !== null)
  const role = computed<Role | undefined>(() => person.value?.role)
  const isClient = computed(() => role.value === 'client')
  const isStaff = computed(() => role.value !== undefined && role.value !== 'client')
  const isAdmin = computed(() => role.value === 'admin')
  /** Admins and aquarists create and edit tanks and clients. */
  const managesTanks = computed(() => role.value !== undefined && TANK_MANAGERS.includes(role.value))
  /** Everyone but supervisors enters water tests and events. */
  const entersTests = computed(() => role.value !== undefined && TEST_ENTRY.includes(role.value))
  /** The person's unit system; metric until someone is signed in. */
  const units = computed<UnitSystem>(() => person.value?.units ?? 'metric')
  /**
   * The clock every moment is shown on: the company's, so the server's page and the hydrated
   * browser agree wherever the browser is. UTC until someone is signed in.
   */
  const timeZone = computed(() => person.value?.timeZone ?? 'UTC')
  /**
   * Staff may read verdicts in the engine's own units (mg/L as N, °C, litres) instead of the
   * tank's kit units, to check a figure against a rule; off on every sign-in. Never for clients.
   */
  const canonicalOn = ref(false)
  const canonicalUnits = computed(() => isStaff.value && canonicalOn.value)
  /** Which voice the verdict speaks in: a client's plain words, staff in kit units, or staff in canonical units. */
  const voice = computed<'client' | 'staff' | 'canonical'>(() => (isStaff.value ? (canonicalUnits.value ? 'canonical' : 'staff') : 'client'))

  function showCanonicalUnits(on: boolean): void {
    canonicalOn.value = on
  }

  /** Takes the session's person (null when signed out); only the fields the interface uses are kept. */
  function setPerson(value: SignedInPerson | null | undefined): void {
    person.value = value ? { id: value.id, name: value.name, role: value.role, units: value.units, timeZone: value.timeZone } : null
  }

  /** A preference saved on the server shows at once, before the session is read again. */
  function setUnits(value: UnitSystem): void {
    if (person.value) person.value = { ...person.value, units: value }
  }

  function $reset(): void {
    person.value = null
    canonicalOn.value = false
  }

  return { person, signedIn, role, isClient, isStaff, isAdmin, managesTanks, entersTests, units, timeZone, canonicalUnits, voice, setPerson, setUnits, showCanonicalUnits, $reset }
})
