import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url));

const alias = {
  '@domain': r('./src/domain'),
  '@server': r('./server'),
  '@': r('./src'),
};

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias },
  build: { outDir: 'dist', sourcemap: true, chunkSizeWarningLimit: 800 },
  server: {
    port: 5173,
    proxy: { '/api': 'http://localhost:3000' },
  },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'domain',
          environment: 'node',
          include: ['tests/domain/**/*.test.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          setupFiles: ['tests/support/server-setup.ts'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        plugins: [react()],
        resolve: { alias },
        test: {
          name: 'client',
          environment: 'jsdom',
          include: ['tests/client/**/*.test.tsx'],
          setupFiles: ['tests/support/client-setup.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/e2e/global-setup.ts'],
          testTimeout: 90_000,
          hookTimeout: 240_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
