import { build, preview } from 'vite';
import type { TestProject } from 'vitest/node';

/**
 * Builds the app as it ships, serves it on 127.0.0.1 (a free port) for the end-to-end tests,
 * and hands them the address through `inject('baseUrl')`.
 */
export default async function serveBuiltApp(project: TestProject): Promise<() => Promise<void>> {
  await build({ logLevel: 'warn', build: { outDir: 'dist/e2e-app', emptyOutDir: true } });
  const server = await preview({
    logLevel: 'warn',
    build: { outDir: 'dist/e2e-app' },
    preview: { host: '127.0.0.1', port: 0, strictPort: false, open: false },
  });
  const address = server.httpServer.address();
  if (!address || typeof address === 'string') throw new Error('the preview server has no TCP address');
  project.provide('baseUrl', `http://127.0.0.1:${address.port}/`);
  return async () => {
    await new Promise<void>((resolve) => server.httpServer.close(() => resolve()));
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}
