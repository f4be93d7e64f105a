/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

// The gateway in development; in production it serves console/dist itself (same origin).
const GATEWAY = 'http://localhost:3000';

export default defineConfig({
  plugins: [react()],
  server: {
    proxy: {
      '/api': { target: GATEWAY, changeOrigin: true },
      '/socket.io': { target: GATEWAY, ws: true, changeOrigin: true },
    },
  },
  preview: {
    proxy: {
      '/api': { target: GATEWAY, changeOrigin: true },
      '/socket.io': { target: GATEWAY, ws: true, changeOrigin: true },
    },
  },
  build: {
    outDir: 'dist',
    sourcemap: true,
    rolldownOptions: {
      output: {
        // Libraries change less often than the console: in their own files they stay cached.
        codeSplitting: {
          groups: [
            {
              name: 'react',
              test: /node_modules[\\/](react|react-dom|react-router|scheduler)[\\/]/,
              priority: 3,
            },
            { name: 'mui', test: /node_modules[\\/](@mui|@emotion|@popperjs|stylis)/, priority: 2 },
            { name: 'vendor', test: /node_modules[\\/]/, priority: 1 },
          ],
        },
      },
    },
  },
  test: {
    environment: 'jsdom',
    setupFiles: ['./src/testing/setup.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    // jsdom with MUI is slow on a loaded 2-core machine: limits for hangs, not for speed
    testTimeout: 30_000,
  },
});
