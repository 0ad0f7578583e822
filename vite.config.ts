import { defineConfig } from 'vite';

// The demo viewer (index.html). `npm start` serves it; `npm run build:demo` writes dist/demo.
export default defineConfig({
  server: { host: '127.0.0.1', port: 5173, strictPort: false },
  preview: { host: '127.0.0.1', port: 4173 },
  build: { outDir: 'dist/demo', emptyOutDir: true, sourcemap: true, chunkSizeWarningLimit: 2500 },
  worker: { format: 'es' },
});
