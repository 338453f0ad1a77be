import { vi } from 'vitest'

/** One upload the page sent through XMLHttpRequest, held until the spec answers it. */
export interface HeldUpload {
  url: string
  headers: Record<string, string>
  form: FormData
  progress(percent: number): void
  answer(status: number, body: unknown): void
}

/** Specs only: XMLHttpRequest as `uploadFile` uses it (jsdom's would try the network). */
export function fakeUploads() {
  const held: HeldUpload[] = []
  class FakeXhr {
    status = 0
    statusText = ''
    responseText = ''
    withCredentials = false
    upload: { onprogress: ((event: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null }
    onload: (() => void) | null = null
    onerror: (() => void) | null = null
    private url = ''
    private readonly headers: Record<string, string> = {}

    open(_method: string, url: string): void {
      this.url = url
    }

    setRequestHeader(name: string, value: string): void {
      this.headers[name] = value
    }

    send(form: FormData): void {
      held.push({
        url: this.url,
        headers: this.headers,
        form,
        progress: (percent) => this.upload.onprogress?.({ lengthComputable: true, loaded: percent, total: 100 }),
        answer: (status, body) => {
          this.status = status
          this.responseText = JSON.stringify(body)
          this.onload?.()
        },
      })
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr)
  return held
}

/** Puts `files` on a file input and lets the page see the change. */
export function chooseFiles(input: HTMLInputElement, files: File[]): void {
  Object.defineProperty(input, 'files', { value: files, configurable: true })
  input.dispatchEvent(new Event('change'))
}
