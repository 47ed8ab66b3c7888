import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

// The API serves under /api on its own port in development (npm run dev at the root starts both).
const apiTarget = `http://127.0.0.1:${process.env.API_PORT || '3000'}`;

export default defineConfig({
  plugins: [react()],
  resolve: {
    alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) },
  },
  server: {
    proxy: { '/api': { target: apiTarget, changeOrigin: false } },
  },
  preview: {
    proxy: { '/api': { target: apiTarget, changeOrigin: false } },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    // Fail loudly in review if a route chunk grows past this (the marking desk must stay light).
    chunkSizeWarningLimit: 400,
    rolldownOptions: {
      // @stavemark/shared and tonal are pure: let unused modules drop out of the bundle.
      treeshake: {
        moduleSideEffects: (id: string) =>
          !/[\\/](shared[\\/]dist|node_modules[\\/]@tonaljs)[\\/]/.test(id),
      },
      output: {
        codeSplitting: {
          // React and the router change rarely: one cached chunk that every page needs.
          groups: [
            {
              name: 'react',
              test: /[\\/]node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom)[\\/]/,
            },
          ],
        },
      },
    },
  },
  test: {
    environment: 'jsdom',
    include: ['src/**/*.test.{ts,tsx}'],
    setupFiles: ['src/test/setup.ts'],
    // Only our own stylesheets are processed (the theme test reads them with ?raw); library CSS is skipped.
    css: { include: [/src\/app\/.*\.css/] },
    restoreMocks: true,
    testTimeout: 20_000,
  },
});
