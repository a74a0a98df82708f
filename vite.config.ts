import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { engineTypesPlugin } from './src/features/properties/engine-types/vite-plugin.ts';

// The API runs separately in development; never default to anything but the local machine.
const apiPort = process.env.PARLEY_API_PORT || '3000';

export default defineConfig({
  // engineTypesPlugin: the Properties editor's type declarations, built from the engine's source.
  plugins: [react(), tailwindcss(), engineTypesPlugin()],
  // Module workers: the engine workers and Monaco's language workers import ES modules.
  worker: { format: 'es' },
  server: {
    proxy: {
      '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false },
    },
  },
  build: {
    outDir: 'dist',
    assetsDir: 'assets',
    emptyOutDir: true,
    // dist/.vite/manifest.json lets the bundle test find which chunks the first page loads.
    manifest: true,
    // Monaco's own chunk is large by nature and only ever loaded lazily.
    chunkSizeWarningLimit: 5_000,
  },
});
