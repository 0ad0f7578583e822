import { defineConfig } from 'vite';

// The demo viewer (index.html). `npm start` serves it; `npm run build:demo` writes dist/demo.
export default defineConfig({
  server: { host: '127.0.0.1', port: 5173, strictPort: false },
  preview: { host: '127.0.0.1', port: 4173 },
  build: { outDir: 'dist/demo', emptyOutDir: true, sourcemap: true, chunkSizeWarningLimit: 2500 },
  worker: { format: 'es' },
  // Scan every page and the worker up front: a dependency found late makes the dev server
  // reload the page, which loses the user's (or a browser test's) work.
  optimizeDeps: {
    entries: ['index.html', 'tests/browser/pages/*.html', 'src/worker/analysis.worker.ts'],
    include: ['maplibre-gl', 'lit', 'd3', 'papaparse', 'proj4', 'flatbush'],
  },
});
