// Starts the built app (.output) as a child process and waits until it answers.
import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'

export interface AppServer { url: string, process: ChildProcess, stop: () => Promise<void> }

export async function startAppServer(options: { port: number, env: Record<string, string | undefined>, inheritOutput?: boolean }): Promise<AppServer> {
  const entry = `${process.env.TALLYMARK_OUTPUT_DIR || '.output'}/server/index.mjs`
  if (!existsSync(entry)) throw new Error(`No build found at ${entry}: run nuxt build first.`)
  // TALLYMARK_SERVER_NODE_ARGS: flags for the app's node, e.g. "--cpu-prof --cpu-prof-dir=/tmp/prof" to profile a benchmark.
  const nodeArgs = (process.env.TALLYMARK_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean)
  const child = spawn(process.execPath, [...nodeArgs, entry], {
    env: { ...process.env, ...options.env, HOST: '127.0.0.1', PORT: String(options.port), NITRO_HOST: '127.0.0.1', NITRO_PORT: String(options.port) },
    stdio: options.inheritOutput ? 'inherit' : ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  child.stdout?.on('data', (d: Buffer) => { output += d.toString() })
  child.stderr?.on('data', (d: Buffer) => {
    output += d.toString()
    if (process.env.TALLYMARK_SERVER_LOG) process.stderr.write(d)
  })
  let exited = false
  child.on('exit', () => { exited = true })
  const url = `http://127.0.0.1:${options.port}`
  for (let i = 0; ; i++) {
    if (exited) throw new Error(`The app exited during start:\n${output}`)
    try {
      const res = await fetch(`${url}/api/health`)
      if (res.ok) break
    }
    catch { /* not listening yet */ }
    if (i > 600) throw new Error(`The app did not answer within 60 s:\n${output}`)
    await new Promise(r => setTimeout(r, 100))
  }
  return {
    url,
    process: child,
    stop: async () => {
      if (exited) return
      child.kill('SIGTERM')
      for (let i = 0; i < 100 && !exited; i++) await new Promise(r => setTimeout(r, 100))
      if (!exited) child.kill('SIGKILL')
    },
  }
}

export function runCommand(command: string, args: string[], env: Record<string, string | undefined> = {}): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: 'inherit', env: { ...process.env, ...env } })
    child.on('exit', code => code === 0 ? resolve() : reject(new Error(`${command} ${args.join(' ')} exited with ${code}`)))
    child.on('error', reject)
  })
}

/** `nuxt dev` on the same port, for npm run dev (hot reload, no build). */
export async function startDevServer(options: { port: number, env: Record<string, string | undefined> }): Promise<AppServer> {
  const child = spawn('npx', ['nuxt', 'dev', '--host', '127.0.0.1', '--port', String(options.port)], {
    env: { ...process.env, ...options.env }, stdio: 'inherit',
  })
  let exited = false
  child.on('exit', () => { exited = true })
  return {
    url: `http://127.0.0.1:${options.port}`,
    process: child,
    stop: async () => {
      if (exited) return
      child.kill('SIGTERM')
      for (let i = 0; i < 100 && !exited; i++) await new Promise(r => setTimeout(r, 100))
    },
  }
}
