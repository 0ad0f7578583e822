import { defineConfig } from 'vite';
import { readFileSync } from 'node:fs';

// The npm package (`npm run build:lib`): ES modules in dist/lib, with every dependency and
// peer dependency (MapLibre) left external for the host's bundler to resolve once.
const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as {
  dependencies?: Record<string, string>;
  peerDependencies?: Record<string, string>;
};
const external = [...Object.keys(pkg.dependencies ?? {}), ...Object.keys(pkg.peerDependencies ?? {})];

export default defineConfig({
  build: {
    outDir: 'dist/lib',
    emptyOutDir: true,
    sourcemap: true,
    minify: false,
    lib: {
      entry: { foldlens: 'src/index.ts', core: 'src/core/index.ts' },
      formats: ['es'],
    },
    rollupOptions: {
      external: (id) => external.some((d) => id === d || id.startsWith(`${d}/`)),
    },
  },
  worker: { format: 'es' },
});
