import { defineConfig } from 'vite';
import { readFileSync } from 'node:fs';
import { builtinModules } from 'node:module';

// The command line (`npm run build:cli`): src/cli/main.ts bundled for Node into
// dist/cli/foldlens.js, the "bin" of package.json. Dependencies and Node built-ins stay
// external (installed alongside, not copied in); the banner makes the file executable.
const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as { dependencies?: Record<string, string> };
const dependencies = Object.keys(pkg.dependencies ?? {});
const builtins = new Set([...builtinModules, ...builtinModules.map((m) => `node:${m}`)]);
const isExternal = (id: string): boolean => builtins.has(id) || id.startsWith('node:') || dependencies.some((d) => id === d || id.startsWith(`${d}/`));

export default defineConfig({
  publicDir: false, // public/ is the demo's (its service worker); the command line needs none of it
  build: {
    ssr: 'src/cli/main.ts',
    outDir: 'dist/cli',
    emptyOutDir: true,
    target: 'node20',
    minify: false,
    sourcemap: true,
    rollupOptions: {
      external: isExternal,
      output: {
        format: 'es',
        entryFileNames: 'foldlens.js',
        banner: '#!/usr/bin/env node',
      },
    },
  },
  ssr: { target: 'node', noExternal: [] },
});
