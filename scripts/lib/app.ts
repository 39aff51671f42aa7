import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, openSync } from 'node:fs'
import { resolve } from 'node:path'

const root = resolve(import.meta.dirname, '../..')

/**
 * How the server process is started, here and in production (README, "Running it yourself"): a
 * bounded JavaScript heap and two malloc arenas. Left to itself V8 sizes the heap from the machine's
 * memory and keeps what a burst of requests grew (the load bench measured 566 MB resident after the
 * load against 379 MB idle); with these the live heap (~80 MB under load) is collected sooner and the
 * process stays near its idle size (docs/performance.md, goal 6). glibc's per-thread arenas otherwise
 * keep the freed buffers of libvips and scrypt threads.
 */
export const SERVER_NODE_FLAGS = ['--max-old-space-size=192', '--max-semi-space-size=8']
export const SERVER_MALLOC_ENV = { MALLOC_ARENA_MAX: '2' }

export interface RunningApp { url: string, child: ChildProcess, stop: () => Promise<void> }

/** Starts the built server (.output) on 127.0.0.1 with the given environment and waits for /api/health. */
export async function startApp(opts: { port: number, env: Record<string, string>, logFile: string }): Promise<RunningApp> {
  const entry = resolve(root, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('The app is not built yet: run `npx nuxt build` first.')
  const log = openSync(opts.logFile, 'a')
  // BENCH_CPU_PROF=dir: the server writes a V8 CPU profile there when it stops (for reading a bench run).
  const prof = process.env.BENCH_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${resolve(root, process.env.BENCH_CPU_PROF)}`] : []
  const child = spawn(process.execPath, [...SERVER_NODE_FLAGS, ...prof, entry], {
    cwd: root,
    env: { ...process.env, ...SERVER_MALLOC_ENV, ...opts.env, HOST: '127.0.0.1', PORT: String(opts.port), NODE_ENV: 'production' },
    stdio: ['ignore', log, log],
  })
  const url = `http://127.0.0.1:${opts.port}`
  const until = Date.now() + 60_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the app exited with code ${child.exitCode}; see ${opts.logFile}`)
    try {
      const res = await fetch(`${url}/api/health`)
      if (res.ok) break
    }
    catch { /* not listening yet */ }
    if (Date.now() > until) throw new Error(`the app did not answer on ${url} within 60 s; see ${opts.logFile}`)
    await new Promise(r => setTimeout(r, 150))
  }
  return {
    url,
    child,
    stop: () => new Promise<void>((done) => {
      if (child.exitCode !== null) return done()
      child.once('exit', () => done())
      child.kill('SIGTERM')
    }),
  }
}
