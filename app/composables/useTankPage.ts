import type { KitBasisChoice } from '#shared/readings/entry'
import { tankDataKeysFor, type TankDataPart } from '~/utils/data-keys'
import { failPageOn } from '~/utils/page-error'

const KIT_BASIS_DEFAULT: KitBasisChoice = { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }

/**
 * What every page under /tanks/:id starts with: the id from the URL, the tank (the error page
 * when it cannot be seen), the kit basis its tests are read in, and a refresh of named parts.
 */
export async function useTankPage() {
  const route = useRoute()
  const id = computed(() => String(route.params.id))
  const { data: tank, error, refresh } = await useTank(id)
  failPageOn(error.value)
  const kitBasis = computed(() => (tank.value?.kitBasis ?? KIT_BASIS_DEFAULT) as KitBasisChoice)
  const refreshParts = (...parts: TankDataPart[]) => Promise.all(tankDataKeysFor(id.value, parts).map(key => refreshNuxtData(key)))
  return { id, tank, refresh, kitBasis, refreshParts }
}
