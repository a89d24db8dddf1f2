import { useQuasar } from 'quasar'
import { useRouter } from 'vue-router'
import type { ScenarioSummary } from '@shared/schemas/vehicles'
import { ApiError } from '../api/http'
import { useScenariosStore } from '../stores/scenarios'

/** Scenario actions shared by the lists and the editor. */
export function useScenarioActions() {
  const $q = useQuasar()
  const router = useRouter()
  const store = useScenariosStore()

  /** Asks for a name ("Winter copy of …"), copies the scenario with its appliance use, opens the copy. */
  function duplicate(s: Pick<ScenarioSummary, 'id' | 'name'>): void {
    $q.dialog({
      title: 'Duplicate scenario',
      message: 'The copy keeps the place, dates, weather, day plan and appliance use; change what differs.',
      prompt: {
        model: `Copy of ${s.name}`.slice(0, 120),
        type: 'text',
        outlined: true,
        isValid: (v: string) => v.trim().length > 0,
      },
      cancel: { flat: true, noCaps: true },
      ok: { unelevated: true, noCaps: true, label: 'Duplicate', color: 'primary' },
    }).onOk(async (name: string) => {
      try {
        const copy = await store.duplicate(s.id, name.trim())
        $q.notify({ type: 'positive', icon: 'content_copy', message: `“${copy.name}” created` })
        await router.push({ name: 'scenarios.edit', params: { scenarioId: copy.id } })
      } catch (e) {
        $q.notify({
          type: 'negative',
          icon: 'error_outline',
          message: `Not duplicated: ${e instanceof ApiError ? e.message : String(e)}`,
        })
      }
    })
  }

  return { duplicate }
}
