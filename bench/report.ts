/**
 * `npm run bench`: runs every benchmark script (each in its own process, so one's memory does not
 * colour another's peak), measures the client's first-load JavaScript from a production build, and
 * writes docs/benchmarks.md with the figures, the machine and the date. Figures only: the targets
 * are printed beside them for people to read, never asserted.
 * `npm run bench -- load client` runs only the parts named (engine, package, load, fuzz, client)
 * and prints them without writing the report.
 */
import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { gzipSync } from 'node:zlib'
import { build } from 'vite'

const ROOT = path.resolve(import.meta.dirname, '..')

interface Part { key: string; title: string; script: string; args?: string[]; targets: string }
const PARTS: Part[] = [
  { key: 'engine', title: 'Calculation engine', script: 'bench/engine.bench.ts', targets: 'none set; for comparison between versions' },
  { key: 'package', title: 'Plan-set package generation', script: 'bench/package.bench.ts', targets: 'residential ≤ 0.4 s, 1 MW ≤ 4 s, peak RSS ≤ 400 MB, ratio to raw pdf-lib ≤ 1.5' },
  { key: 'load', title: 'Load on loopback (autocannon)', script: 'bench/load.bench.ts', args: ['10'], targets: 'reads ≥ 1,500 req/s with p99 ≤ 50 ms at 10 connections' },
  { key: 'fuzz', title: 'Fuzz run', script: 'bench/fuzz.bench.ts', args: ['10000'], targets: 'no violations: never a 5xx, never NaN or Infinity, always field-named errors' },
]

function runPart(part: Part): string {
  process.stdout.write(`[bench] ${part.title}…\n`)
  try {
    return execFileSync(process.execPath, ['--import', 'tsx', part.script, ...(part.args ?? [])], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], maxBuffer: 16 * 1024 * 1024 })
  } catch (err) {
    const out = (err as { stdout?: string }).stdout ?? ''
    return `${out}\n(the script ended with an error: ${(err as Error).message.split('\n')[0]})`
  }
}

/**
 * Gzip size of the JavaScript a signed-out visitor loads before the first page shows: the entry
 * chunk, the sign-in page's lazy chunk, and every chunk those import statically (Vite manifest).
 */
async function clientFirstLoad(): Promise<string> {
  process.stdout.write('[bench] Client production build…\n')
  const outDir = mkdtempSync(path.join(os.tmpdir(), 'stringline-client-'))
  try {
    await build({ root: ROOT, logLevel: 'error', build: { outDir, emptyOutDir: true, manifest: true } })
    type Chunk = { file: string; isEntry?: boolean; imports?: string[]; css?: string[] }
    const manifest = JSON.parse(readFileSync(path.join(outDir, '.vite', 'manifest.json'), 'utf8')) as Record<string, Chunk>
    const entry = Object.keys(manifest).find((k) => manifest[k]!.isEntry)!
    const signIn = Object.keys(manifest).find((k) => k.endsWith('pages/SignInPage.vue'))
    const seen = new Set<string>()
    const visit = (key: string) => {
      if (seen.has(key) || !manifest[key]) return
      seen.add(key)
      manifest[key]!.imports?.forEach(visit)
    }
    ;[entry, signIn].forEach((k) => k && visit(k))
    const gz = (file: string) => gzipSync(readFileSync(path.join(outDir, file))).length
    const chunks = [...seen].map((k) => manifest[k]!)
    const js = chunks.reduce((t, c) => t + gz(c.file), 0)
    const css = [...new Set(chunks.flatMap((c) => c.css ?? []))].reduce((t, f) => t + gz(f), 0)
    return [
      `First-load JavaScript (entry + sign-in page + their static imports): **${(js / 1024).toFixed(1)} KB gzip** in ${chunks.length} chunks; target ≤ 250 KB gzip.`,
      `First-load CSS: ${(css / 1024).toFixed(1)} KB gzip. Other pages load lazily when opened.`,
    ].join('\n\n')
  } finally {
    rmSync(outDir, { recursive: true, force: true })
  }
}

const only = process.argv.slice(2)
const wanted = (key: string) => only.length === 0 || only.includes(key)
const sections: string[] = []
for (const part of PARTS.filter((p) => wanted(p.key))) sections.push(`## ${part.title}\n\nTargets: ${part.targets}.\n\n${'```'}\n${runPart(part).trim()}\n${'```'}`)
if (wanted('client')) sections.push(`## Client\n\n${await clientFirstLoad()}`)

const cpus = os.cpus()
const gitRev = (() => { try { return execFileSync('git', ['rev-parse', '--short', 'HEAD'], { cwd: ROOT, encoding: 'utf8' }).trim() } catch { return 'unknown' } })()
const report = `# Benchmarks

Written by \`npm run bench\` (bench/report.ts) on ${new Date().toISOString().slice(0, 10)} at commit ${gitRev}.
Machine: ${cpus.length} × ${cpus[0]?.model.trim() ?? 'unknown CPU'}, ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB memory, ${os.type()} ${os.release()}, Node.js ${process.version}.
Figures depend on the machine and on what else runs on it; compare runs on the same machine.

${sections.join('\n\n')}
`
if (only.length === 0) writeFileSync(path.join(ROOT, 'docs', 'benchmarks.md'), report)
console.log(report)
