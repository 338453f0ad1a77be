/**
 * Load on loopback with autocannon against a throwaway server (production settings, demo data):
 * sign-in, the project list, a design read and the calculation route, each at 10 and 100
 * connections for a bounded time. Prints a markdown table; bench/report.ts puts it in
 * docs/benchmarks.md. Targets (for people to read): reads ≥ 1,500 req/s with p99 ≤ 50 ms at 10
 * connections. Run: npx tsx bench/load.bench.ts [seconds per case]
 */
import autocannon from 'autocannon'
import { DEMO_PASSWORD } from '../server/demo/seed'
import { DEMO_DESIGN_INPUTS } from '../shared/demo/designs'
import { signIn, startThrowawayServer } from './support/throwaway-server'

const SECONDS = Number(process.argv[2] ?? 10)
const server = await startThrowawayServer()
const email = 'designer@larkspur-solar.example'
const token = await signIn(server.url, email, DEMO_PASSWORD)
const auth = { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' }
const projects = (await (await fetch(`${server.url}/api/projects?pageSize=50`, { headers: auth })).json()) as { items: { id: string; code: string }[] }
const project = projects.items.find((p) => p.code === 'CH-0101') ?? projects.items[0]!

interface Case { name: string; method: 'GET' | 'POST'; path: string; body?: string; headers: Record<string, string>; connections: number[] }
const cases: Case[] = [
  // bcrypt at cost 12 is meant to be slow; 100 connections would only queue hashes
  { name: 'Sign-in (bcrypt cost 12)', connections: [10], method: 'POST', path: '/api/auth/login', body: JSON.stringify({ email, password: DEMO_PASSWORD }), headers: { 'Content-Type': 'application/json' } },
  { name: 'Project list', connections: [10, 100], method: 'GET', path: '/api/projects?pageSize=25', headers: auth },
  { name: 'Design read', connections: [10, 100], method: 'GET', path: `/api/projects/${project.id}/design`, headers: auth },
  { name: 'Calculation (residential)', connections: [10, 100], method: 'POST', path: '/api/calculations', body: JSON.stringify(DEMO_DESIGN_INPUTS.gridTied), headers: auth },
]

console.log(`| Route | Connections | Requests/s (mean) | p50 ms | p99 ms | Errors / non-2xx |`)
console.log(`|---|---:|---:|---:|---:|---:|`)
for (const c of cases) {
  for (const connections of c.connections) {
    const result = await autocannon({ url: `${server.url}${c.path}`, method: c.method, body: c.body, headers: c.headers, connections, duration: SECONDS })
    const bad = result.errors + result.timeouts + result.non2xx
    console.log(`| ${c.name} | ${connections} | ${Math.round(result.requests.average)} | ${result.latency.p50} | ${result.latency.p99} | ${bad} |`)
  }
}
await new Promise((resolve) => setTimeout(resolve, 1000)) // let answers still in flight finish
await server.stop()
