import { onBeforeUnmount, onMounted, type Ref } from 'vue'
import { onBeforeRouteLeave, onBeforeRouteUpdate } from 'vue-router'
import { ElMessageBox } from 'element-plus'
import 'element-plus/es/components/message-box/style/css'

/**
 * Asks before unsaved work is lost: leaving the page inside the app, or moving it to another
 * record, asks in a dialog; closing or reloading the tab gets the browser's own question.
 */
export function useUnsavedGuard(dirty: Readonly<Ref<boolean>>, what = 'this design'): void {
  const confirmLeave = async () => {
    if (!dirty.value) return true
    try {
      await ElMessageBox.confirm(`You have unsaved changes to ${what}. Leave and lose them?`, 'Unsaved changes', {
        confirmButtonText: 'Leave without saving',
        cancelButtonText: 'Stay',
        type: 'warning',
      })
      return true
    } catch {
      return false
    }
  }
  onBeforeRouteLeave(confirmLeave)
  // the same page with another id (one project's design to another's) reuses the component
  onBeforeRouteUpdate((to, from) => (to.path === from.path ? true : confirmLeave()))

  const onBeforeUnload = (event: BeforeUnloadEvent) => {
    if (!dirty.value) return
    event.preventDefault()
    // older browsers show the question only when returnValue is set
    event.returnValue = ''
  }
  onMounted(() => window.addEventListener('beforeunload', onBeforeUnload))
  onBeforeUnmount(() => window.removeEventListener('beforeunload', onBeforeUnload))
}
