import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      '@splitscope/contract': here('../../packages/contract/src/index.ts'),
      '@splitscope/boards': here('../../packages/boards/src/index.ts'),
      '@splitscope/circuit': here('../../packages/circuit/src/index.ts'),
      '@': here('./src'),
    },
  },
  server: {
    port: 5173,
    host: '127.0.0.1',
    proxy: { '/api': { target: `http://127.0.0.1:${process.env.PORT ?? 5180}`, changeOrigin: false } },
  },
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: false, chunkSizeWarningLimit: 700 },
});
