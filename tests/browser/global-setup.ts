import { createServer, type ViteDevServer } from 'vite';
import type { TestProject } from 'vitest/node';

// Starts the demo's vite server once for all browser tests and shares its URL.
let server: ViteDevServer | undefined;

export async function setup(project: TestProject): Promise<void> {
  server = await createServer({ configFile: 'vite.config.ts', server: { port: 0, host: '127.0.0.1' }, logLevel: 'error' });
  await server.listen();
  const address = server.httpServer?.address();
  if (!address || typeof address === 'string') throw new Error('vite server did not report a port');
  project.provide('demoUrl', `http://127.0.0.1:${address.port}/`);
}

export async function teardown(): Promise<void> {
  await server?.close();
}

declare module 'vitest' {
  export interface ProvidedContext {
    demoUrl: string;
  }
}
