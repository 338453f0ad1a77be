import { api } from './client'
import { errorFromResponse, networkError } from './errors'
import { useAuthStore } from '@/stores/auth'

/** Share of the bytes sent so far, 0–100. */
export type ProgressListener = (percent: number) => void

interface XhrAnswer {
  status: number
  statusText: string
  body: string
}

function sendWithProgress(url: string, form: FormData, token: string | null, onProgress: ProgressListener): Promise<XhrAnswer> {
  return new Promise((resolve, reject) => {
    // fetch cannot report upload progress; XMLHttpRequest can
    const xhr = new XMLHttpRequest()
    xhr.open('POST', url)
    xhr.setRequestHeader('Accept', 'application/json')
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`)
    xhr.withCredentials = true
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(Math.round((event.loaded / event.total) * 100))
    }
    xhr.onload = () => resolve({ status: xhr.status, statusText: xhr.statusText, body: xhr.responseText })
    xhr.onerror = () => reject(networkError(new Error('upload failed')))
    xhr.send(form)
  })
}

const asResponse = (answer: XhrAnswer) =>
  new Response(answer.body || null, { status: answer.status, statusText: answer.statusText, headers: { 'Content-Type': 'application/json' } })

/**
 * Uploads one file as multipart form data with progress, refreshing the session once on 401 as
 * every other call does. Resolves with the parsed JSON answer.
 */
export async function uploadFile<T>(path: string, file: File, fields: Record<string, string>, onProgress: ProgressListener): Promise<T> {
  const auth = useAuthStore()
  const form = new FormData()
  for (const [name, value] of Object.entries(fields)) form.set(name, value)
  form.set('file', file)
  let answer = await sendWithProgress(`/api${path}`, form, auth.token, onProgress)
  if (answer.status === 401) {
    const fresh = await api.refreshSession()
    if (fresh) answer = await sendWithProgress(`/api${path}`, form, fresh.token, onProgress)
  }
  const response = asResponse(answer)
  if (!response.ok) throw await errorFromResponse(response)
  return (await response.json()) as T
}

/** Fetches a file the API sends as an attachment and hands it to the browser to save. */
export async function downloadFile(path: string, fileName: string): Promise<void> {
  const url = URL.createObjectURL(await fetchBlob(path))
  const link = document.createElement('a')
  link.href = url
  link.download = fileName
  link.click()
  URL.revokeObjectURL(url)
}

/**
 * The bytes of an authenticated GET as a Blob (the token goes in the header, never in a URL),
 * with one refresh on 401; `mediaType` overrides the answer's type, e.g. for an `<img>` preview.
 */
export async function fetchBlob(path: string, mediaType?: string): Promise<Blob> {
  const auth = useAuthStore()
  const get = (token: string | null) =>
    fetch(`/api${path}`, { headers: token ? { Authorization: `Bearer ${token}` } : {}, credentials: 'include' }).catch((cause: unknown) => {
      throw networkError(cause)
    })
  let response = await get(auth.token)
  if (response.status === 401) {
    const fresh = await api.refreshSession()
    if (fresh) response = await get(fresh.token)
  }
  if (!response.ok) throw await errorFromResponse(response)
  // built from the bytes: a Blob of one realm (fetch's) is not a part another (the page's) accepts
  return new Blob([await response.arrayBuffer()], { type: mediaType ?? response.headers.get('Content-Type') ?? '' })
}
