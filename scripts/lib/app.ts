import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, openSync } from 'node:fs'
import { resolve } from 'node:path'

const root = resolve(import.meta.dirname, '../..')

export interface RunningApp { url: string, child: ChildProcess, stop: () => Promise<void> }

/** Starts the built server (.output) on 127.0.0.1 with the given environment and waits for /api/health. */
export async function startApp(opts: { port: number, env: Record<string, string>, logFile: string }): Promise<RunningApp> {
  const entry = resolve(root, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('The app is not built yet: run `npx nuxt build` first.')
  const log = openSync(opts.logFile, 'a')
  // BENCH_CPU_PROF=dir: the server writes a V8 CPU profile there when it stops (for reading a bench run).
  const prof = process.env.BENCH_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${resolve(root, process.env.BENCH_CPU_PROF)}`] : []
  const child = spawn(process.execPath, [...prof, entry], {
    cwd: root,
    env: { ...process.env, ...opts.env, HOST: '127.0.0.1', PORT: String(opts.port), NODE_ENV: 'production' },
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
