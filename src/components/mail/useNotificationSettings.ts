import { ref } from 'vue'
import type { NotificationCategory, NotificationSettingsDto } from '@shared/schemas/notifications'
import { ApiError } from '@/api/errors'
import { notificationsApi } from '@/api/notifications'

type Setting = NotificationSettingsDto['items'][number]

/**
 * The signed-in member's e-mail switches. A switch moves at once; the whole list of opt-outs is
 * saved, one save at a time, and a refused save puts the switch back.
 */
export function useNotificationSettings() {
  const settings = ref<Setting[]>([])
  const loaded = ref(false)
  const saving = ref<NotificationCategory | null>(null)
  const problem = ref<string | null>(null)

  async function load(): Promise<void> {
    try {
      settings.value = await notificationsApi.settings()
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      problem.value = `Your e-mail settings could not be loaded. ${error.message}`
    } finally {
      loaded.value = true
    }
  }

  async function toggle(category: NotificationCategory, enabled: boolean): Promise<void> {
    const setting = settings.value.find((s) => s.category === category)
    if (!setting || saving.value) return
    problem.value = null
    setting.enabled = enabled
    saving.value = category
    try {
      settings.value = await notificationsApi.save(settings.value.filter((s) => !s.enabled).map((s) => s.category))
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      setting.enabled = !enabled
      problem.value = `“${setting.label}” could not be switched ${enabled ? 'on' : 'off'}. ${error.message}`
    } finally {
      saving.value = null
    }
  }

  return { settings, loaded, saving, problem, load, toggle }
}
