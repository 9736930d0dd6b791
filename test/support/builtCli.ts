import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';

/**
 * Builds the `lurk` command from the current sources into a fresh folder of its own (under dist/, so the bundle
 * finds its packages in node_modules) and returns the path of its lurk.js. Each test file gets its own build, so
 * test files running at the same time never see a half-written bundle.
 */
export async function buildCliForTest(): Promise<{ lurk: string; remove(): void }> {
  const dist = fileURLToPath(new URL('../../dist/', import.meta.url));
  mkdirSync(dist, { recursive: true });
  const outDir = mkdtempSync(join(dist, 'test-cli-'));
  await build({ logLevel: 'silent', build: { ssr: 'src/cli/lurk.ts', outDir, emptyOutDir: true } });
  return { lurk: join(outDir, 'lurk.js'), remove: () => rmSync(outDir, { recursive: true, force: true }) };
}
