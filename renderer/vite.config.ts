/**
 * Builds the planner's screens into dist-renderer/ (git-ignored). Relative asset paths, so the same
 * build serves from the preview's loopback server and from the Electron shell's app:// protocol.
 */
import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const here = fileURLToPath(new URL('.', import.meta.url));

export default defineConfig({
  root: here,
  base: './',
  plugins: [react()],
  build: {
    outDir: fileURLToPath(new URL('../dist-renderer', import.meta.url)),
    emptyOutDir: true,
    sourcemap: false,
    chunkSizeWarningLimit: 1500,
  },
  logLevel: 'warn',
});
