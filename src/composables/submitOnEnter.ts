/**
 * A keydown handler for a form: Enter in a text field submits once. Enter inside a select
 * picks an option instead, and the native implicit submit is prevented so it cannot fire twice.
 */
export function submitOnEnter(submit: () => unknown) {
  return (event: KeyboardEvent): void => {
    if (event.key !== 'Enter' || event.isComposing) return
    const field = event.target
    if (!(field instanceof HTMLInputElement) || field.closest('.el-select')) return
    event.preventDefault()
    void submit()
  }
}
