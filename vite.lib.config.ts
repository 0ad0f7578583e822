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
  // public/ holds the demo's service worker; the package has no use for it.
  publicDir: false,
  // Relative asset URLs: the analysis and parse workers are then referenced as
  // `new URL('assets/<worker>.js', import.meta.url)`, which the host's bundler finds and copies
  // (an absolute '/assets/...' would point at the host site's root, where no worker is).
  base: './',
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
