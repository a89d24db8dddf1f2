import { spawn, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import { ROOT } from './paths'

/**
 * The local stand-ins for outside services that `npm start` and `npm test` run on loopback.
 * Each entry is a tsx script that listens on the port given in its env and prints "ready" when it does.
 * One line per fake.
 */
export interface FakeSpec {
  name: string
  script: string
  env: Record<string, string>
}

export function fakeSpecs(ports: Record<string, number>): FakeSpec[] {
  void ports
  return [
    {
      name: 'mail',
      script: 'scripts/fakes/mail.ts',
      env: { SMTP_PORT: String(ports.smtp ?? 2525), SMTP_API_PORT: String(ports.smtpApi ?? 2526) },
    },
    { name: 'payments', script: 'scripts/fakes/payments.ts', env: { PORT: String(ports.stripe ?? 12111) } },
  ]
}

export async function startFakes(specs: FakeSpec[], quiet = false): Promise<ChildProcess[]> {
  const children: ChildProcess[] = []
  for (const spec of specs) {
    const child = spawn(process.execPath, ['--import', 'tsx', resolve(ROOT, spec.script)], {
      env: { ...process.env, ...spec.env },
      stdio: ['ignore', 'pipe', 'inherit'],
    })
    children.push(child)
    await new Promise<void>((ok, fail) => {
      const timer = setTimeout(() => fail(new Error(`${spec.name} did not start in 20 s`)), 20_000)
      child.stdout?.on('data', (buf: Buffer) => {
        if (buf.toString().includes('ready')) {
          clearTimeout(timer)
          ok()
        }
        if (!quiet) process.stdout.write(`[${spec.name}] ${buf.toString()}`)
      })
      child.once('exit', (code) => fail(new Error(`${spec.name} exited with ${code}`)))
    })
  }
  return children
}
