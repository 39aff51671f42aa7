import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync } from 'node:fs'

/**
 * Installs Debian packages with apt-get when the given binary is missing. Says plainly what to do
 * by hand when it cannot (not root, no apt-get, or the install failed).
 */
export function ensureDebianPackage(binary: string, packages: string[], why: string): void {
  if (existsSync(binary)) return
  const asRoot = typeof process.getuid === 'function' && process.getuid() === 0
  const hasApt = spawnSync('sh', ['-c', 'command -v apt-get']).status === 0
  const manual = `sudo apt-get update && sudo apt-get install -y ${packages.join(' ')}`
  if (!hasApt || !asRoot) {
    throw new Error(`${binary} is missing (${why}). Install it with:\n  ${manual}\nthen run the command again.`)
  }
  console.log(`[setup] installing ${packages.join(', ')} with apt-get (${why})…`)
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  try {
    execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env })
    execFileSync('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { stdio: 'inherit', env })
  }
  catch {
    throw new Error(`apt-get could not install ${packages.join(' ')}. Try by hand:\n  ${manual}`)
  }
  if (!existsSync(binary)) throw new Error(`${binary} is still missing after installing ${packages.join(' ')}.`)
}
