import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const srcDir = fileURLToPath(new URL('./src', import.meta.url));
const commonSrcDir = fileURLToPath(new URL('../common/src', import.meta.url));
const apiTarget = 'http://127.0.0.1:5180';

export default defineConfig({
  plugins: [react()],
  resolve: {
    alias: [
      // `common` is consumed from source so the browser and the server share one copy of the types and math.
      { find: /^@kilocycle\/common\/(.+)$/, replacement: `${commonSrcDir}/$1/index.ts` },
      { find: /^@\//, replacement: `${srcDir}/` },
    ],
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: apiTarget, changeOrigin: true },
      '/socket.io': { target: apiTarget, changeOrigin: true, ws: true },
    },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
    rolldownOptions: {
      output: {
        // React and the router change rarely, so they get a long-lived chunk of their own. The data grid gets a named
        // chunk without its dependencies: pulling shared MUI modules in would make every page preload it.
        codeSplitting: {
          groups: [
            { name: 'react', test: /node_modules[\\/](react|react-dom|react-router|react-router-dom|scheduler)[\\/]/ },
            { name: 'data-grid', test: /node_modules[\\/]@mui[\\/]x-/, includeDependenciesRecursively: false },
          ],
        },
      },
    },
  },
});
