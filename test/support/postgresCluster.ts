import { spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A throw-away PostgreSQL cluster on 127.0.0.1 for one test run: started by `startCluster`, removed by `stop`. */
export interface PostgresCluster {
  readonly host: string;
  readonly port: number;
  readonly user: string;
  readonly database: string;
  stop(): void;
}

/** The folder of Debian's PostgreSQL server programs (newest version), or null when none is installed. */
export function postgresBin(): string | null {
  if (process.env.LURK_PG_BIN) return process.env.LURK_PG_BIN;
  try {
    const versions = readdirSync('/usr/lib/postgresql').sort((a, b) => Number(b) - Number(a));
    return versions.length ? join('/usr/lib/postgresql', versions[0], 'bin') : null;
  } catch {
    return null;
  }
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

/**
 * Starts a new cluster in a temporary folder, listening on 127.0.0.1 only, on a free port. `initdb` refuses to
 * run as root, so as root the programs run as the `postgres` user (which Debian's package creates).
 */
export async function startCluster(): Promise<PostgresCluster> {
  const bin = postgresBin();
  if (!bin) throw new Error('PostgreSQL is not installed (test/support/ensure-postgres.sh installs it)');
  const dir = mkdtempSync(join(tmpdir(), 'lurk-pg-'));
  chmodSync(dir, 0o777);
  const data = join(dir, 'data');
  const port = await freePort();
  const asRoot = process.getuid?.() === 0;
  const run = (program: string, args: string[]) => {
    const command = [join(bin, program), ...args].map((a) => `'${a.replace(/'/g, `'\\''`)}'`).join(' ');
    const result = asRoot ? spawnSync('su', ['postgres', '-s', '/bin/sh', '-c', command], { encoding: 'utf8' }) : spawnSync('/bin/sh', ['-c', command], { encoding: 'utf8' });
    if (result.status !== 0) throw new Error(`${program} failed: ${result.stderr || result.stdout}`);
  };
  run('initdb', ['-D', data, '-A', 'trust', '-U', 'lurk', '--no-sync', '-E', 'UTF8', '--locale=C']);
  run('pg_ctl', ['-D', data, '-o', `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off`, '-l', join(dir, 'log'), 'start', '-w']);
  return {
    host: '127.0.0.1',
    port,
    user: 'lurk',
    database: 'postgres',
    stop() {
      try {
        run('pg_ctl', ['-D', data, 'stop', '-w', '-m', 'fast']);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}

