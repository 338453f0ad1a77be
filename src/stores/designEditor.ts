import { computed, ref, shallowRef, watch } from 'vue'
import { defineStore } from 'pinia'
import { evaluateDocument, type Evaluation } from '@shared/electrical/evaluate'
import type { EngineIssue } from '@shared/electrical/types'
import type { DesignDocument } from '@shared/schemas/design'
import { designsApi } from '@/api/designs'
import { ApiError } from '@/api/errors'
import type { DesignDto, ServerEvaluation } from '@/api/types'
import { changesBySomeoneElse, countOwnChanges, type DocumentChange } from './designChanges'

/** Pause after the last keystroke before the live results are computed again [ms]. */
export const LIVE_RESULTS_PAUSE_MS = 250

/** Someone else saved the design after this editor loaded it. */
export interface DesignConflict {
  theirs: DesignDto
  changes: DocumentChange[]
  ownChangeCount: number
}

export type SaveOutcome = 'saved' | 'conflict' | 'rejected'

// the document is plain JSON; a JSON copy also sheds the reactive proxies nested inside it
const copy = (document: DesignDocument): DesignDocument => JSON.parse(JSON.stringify(document)) as DesignDocument

/**
 * The design being edited: the working document, the version it was read at, the live results
 * of the shared engine (recomputed a moment after each change) and the result the server keeps.
 */
export const useDesignEditorStore = defineStore('design-editor', () => {
  const projectId = ref<string | null>(null)
  const document = ref<DesignDocument | null>(null)
  /** The document as last loaded or saved: what "unsaved changes" are measured against. */
  const baseline = shallowRef<DesignDocument | null>(null)
  /** null until the project's first design is saved. */
  const version = ref<number | null>(null)
  const live = shallowRef<Evaluation | null>(null)
  const server = shallowRef<ServerEvaluation | null>(null)
  const conflict = shallowRef<DesignConflict | null>(null)
  /** Field messages of the last refused save, keyed by document path. */
  const saveProblems = shallowRef<{ message: string; fields: { field: string; message: string }[] } | null>(null)
  const saving = ref(false)
  const checking = ref(false)

  const baselineJson = computed(() => (baseline.value ? JSON.stringify(baseline.value) : ''))
  const dirty = computed(() => document.value !== null && (version.value === null || JSON.stringify(document.value) !== baselineJson.value))

  let timer: ReturnType<typeof setTimeout> | undefined
  function evaluateNow(): void {
    clearTimeout(timer)
    live.value = document.value ? evaluateDocument(copy(document.value)) : null
  }
  watch(
    document,
    () => {
      clearTimeout(timer)
      timer = setTimeout(evaluateNow, LIVE_RESULTS_PAUSE_MS)
    },
    { deep: true },
  )

  function adopt(design: DesignDto): void {
    document.value = copy(design.document)
    baseline.value = copy(design.document)
    version.value = design.version
    if (server.value && server.value.designVersion !== design.version) server.value = null
    saveProblems.value = null
    evaluateNow()
  }

  /** A project with a saved design. */
  function open(id: string, design: DesignDto): void {
    projectId.value = id
    server.value = null
    conflict.value = null
    adopt(design)
  }

  /** A project's first design, not saved yet. */
  function start(id: string, starter: DesignDocument): void {
    projectId.value = id
    document.value = copy(starter)
    baseline.value = copy(starter)
    version.value = null
    server.value = null
    conflict.value = null
    saveProblems.value = null
    evaluateNow()
  }

  function close(): void {
    clearTimeout(timer)
    projectId.value = null
    document.value = null
    baseline.value = null
    version.value = null
    live.value = null
    server.value = null
    conflict.value = null
    saveProblems.value = null
  }

  /** Engine issues about one field of the document (exact path or anything under it). */
  function issuesAt(path: string): EngineIssue[] {
    return (live.value?.issues ?? []).filter((issue) => issue.field === path || issue.field.startsWith(`${path}.`) || issue.field.startsWith(`${path}[`))
  }

  async function save(): Promise<SaveOutcome> {
    const id = projectId.value
    if (!id || !document.value || saving.value) return 'rejected'
    saving.value = true
    saveProblems.value = null
    try {
      adopt(await designsApi.save(id, version.value, copy(document.value)))
      return 'saved'
    } catch (error) {
      if (!(error instanceof ApiError)) throw error
      if (error.status === 409 && baseline.value) {
        const theirs = await designsApi.get(id)
        conflict.value = {
          theirs,
          changes: changesBySomeoneElse(baseline.value, theirs.document, document.value),
          ownChangeCount: countOwnChanges(baseline.value, document.value),
        }
        return 'conflict'
      }
      saveProblems.value = { message: error.message, fields: [...error.fields] }
      return 'rejected'
    } finally {
      saving.value = false
    }
  }

  /** Drop this editor's changes and take the other person's saved version. */
  function reloadTheirs(): void {
    if (!conflict.value) return
    adopt(conflict.value.theirs)
    conflict.value = null
  }

  /** Keep editing on top of the other person's version: the next save replaces it with this document. */
  function keepMine(): void {
    const theirs = conflict.value?.theirs
    if (!theirs) return
    version.value = theirs.version
    baseline.value = copy(theirs.document)
    conflict.value = null
  }

  /** Runs the engine on the server over the stored design; the result that is kept and printed. */
  async function checkOnServer(): Promise<void> {
    const id = projectId.value
    if (!id || dirty.value) return
    checking.value = true
    try {
      server.value = await designsApi.evaluate(id)
    } finally {
      checking.value = false
    }
  }

  return {
    projectId, document, baseline, version, live, server, conflict, saveProblems, saving, checking, dirty,
    open, start, close, evaluateNow, issuesAt, save, reloadTheirs, keepMine, checkOnServer,
  }
})
