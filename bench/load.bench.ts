/**
 * Load on loopback with autocannon against a throwaway server (production settings, demo data):
 * sign-in, the project list, a design read and the calculation route, each at 10 and 100
 * connections for a bounded time, first with the API as one process, then as one process per core
 * (API_PROCESSES, server/api-cluster.ts). Prints a markdown table; bench/report.ts puts it in
 * docs/benchmarks.md. Targets (for people to read): reads ≥ 1,500 req/s with p99 ≤ 50 ms at 10
 * connections. Run: npx tsx bench/load.bench.ts [seconds per case]
 */
import { availableParallelism } from 'node:os'
import autocannon from 'autocannon'
import { DEMO_PASSWORD } from '../server/demo/seed'
import { DEMO_DESIGN_INPUTS } from '../shared/demo/designs'
import { signIn, startThrowawayServer } from './support/throwaway-server'

const SECONDS = Number(process.argv[2] ?? 10)
const WARM_UP_SECONDS = 2
const email = 'designer@larkspur-solar.example'
/** One API process, then one per core (the same when the machine has one core). */
const LAYOUTS = [...new Set([1, availableParallelism()])]

interface Case { name: string; method: 'GET' | 'POST'; path: string; body?: string; headers: Record<string, string>; connections: number[] }

function casesFor(token: string, projectId: string): Case[] {
  const auth = { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' }
  return [
    { name: 'Project list', connections: [10, 100], method: 'GET', path: '/api/projects?pageSize=25', headers: auth },
    { name: 'Design read', connections: [10, 100], method: 'GET', path: `/api/projects/${projectId}/design`, headers: auth },
    { name: 'Calculation (residential)', connections: [10, 100], method: 'POST', path: '/api/calculations', body: JSON.stringify(DEMO_DESIGN_INPUTS.gridTied), headers: auth },
    // last: hashes still queued when it ends would slow the reads. bcrypt at cost 12 is meant to be
    // slow; 100 connections would only queue hashes
    { name: 'Sign-in (bcrypt cost 12)', connections: [10], method: 'POST', path: '/api/auth/login', body: JSON.stringify({ email, password: DEMO_PASSWORD }), headers: { 'Content-Type': 'application/json' } },
  ]
}

console.log(`| API processes | Route | Connections | Requests/s (mean) | p50 ms | p99 ms | Errors / non-2xx |`)
console.log(`|---:|---|---:|---:|---:|---:|---:|`)
for (const processes of LAYOUTS) {
  const server = await startThrowawayServer({ API_PROCESSES: String(processes) })
  const token = await signIn(server.url, email, DEMO_PASSWORD)
  const projects = (await (await fetch(`${server.url}/api/projects?pageSize=50`, { headers: { Authorization: `Bearer ${token}` } })).json()) as { items: { id: string; code: string }[] }
  const project = projects.items.find((p) => p.code === 'CH-0101') ?? projects.items[0]!
  for (const c of casesFor(token, project.id)) {
    for (const connections of c.connections) {
      const load = { url: `${server.url}${c.path}`, method: c.method, body: c.body, headers: c.headers, connections }
      // unmeasured: the JIT and each connection's prepared statements warm up first
      await autocannon({ ...load, duration: WARM_UP_SECONDS })
      const result = await autocannon({ ...load, duration: SECONDS })
      const bad = result.errors + result.timeouts + result.non2xx
      console.log(`| ${processes} | ${c.name} | ${connections} | ${Math.round(result.requests.average)} | ${result.latency.p50} | ${result.latency.p99} | ${bad} |`)
    }
  }
  await new Promise((resolve) => setTimeout(resolve, 1000)) // let answers still in flight finish
  await server.stop()
}
