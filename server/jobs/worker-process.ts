import { spawn, type ChildProcess } from 'node:child_process'
import { createInterface } from 'node:readline'

export interface WorkerProcess {
  /** Asks the worker to finish its job in hand and waits for it to exit (killed after 15 s). */
  stop(): Promise<void>
}

/**
 * Runs `server/worker.ts` as a child process for the local launchers, with each of its log lines
 * prefixed, and starts it again (after a pause) should it die.
 */
export function superviseWorker(options: { command: string; args: string[]; env: NodeJS.ProcessEnv; log: (line: string) => void; prefix?: string }): WorkerProcess {
  const prefix = options.prefix ?? '[worker]'
  let child: ChildProcess | null = null
  let stopping = false
  let restartTimer: NodeJS.Timeout | undefined

  const start = () => {
    const proc = spawn(options.command, options.args, { env: options.env, stdio: ['ignore', 'pipe', 'pipe'] })
    child = proc
    for (const stream of [proc.stdout, proc.stderr]) {
      createInterface({ input: stream }).on('line', (line) => (stream === proc.stderr ? process.stderr : process.stdout).write(`${prefix} ${line}\n`))
    }
    proc.once('exit', (code, signal) => {
      child = null
      if (stopping) return
      options.log(`The plan-set worker stopped (${signal ?? `exit code ${code}`}); starting it again in 3 s`)
      restartTimer = setTimeout(start, 3000)
    })
  }
  start()

  return {
    async stop() {
      stopping = true
      clearTimeout(restartTimer)
      const proc = child
      if (!proc) return
      const exited = new Promise<void>((resolve) => proc.once('exit', () => resolve()))
      proc.kill('SIGTERM')
      const killer = setTimeout(() => proc.kill('SIGKILL'), 15_000)
      await exited
      clearTimeout(killer)
    },
  }
}
