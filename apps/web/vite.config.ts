import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    // Sub-paths first: the unit parser (mathjs) and the bench references load only in the screens that use them.
    alias: [
      { find: /^@splitscope\/boards\/units$/, replacement: here('../../packages/boards/src/units.ts') },
      { find: /^@splitscope\/boards\/references$/, replacement: here('../../packages/boards/src/references/index.ts') },
      { find: /^@splitscope\/contract$/, replacement: here('../../packages/contract/src/index.ts') },
      { find: /^@splitscope\/boards$/, replacement: here('../../packages/boards/src/index.ts') },
      { find: /^@splitscope\/circuit$/, replacement: here('../../packages/circuit/src/index.ts') },
      { find: /^@\//, replacement: here('./src') + '/' },
    ],
  },
  server: {
    port: 5173,
    host: '127.0.0.1',
    proxy: { '/api': { target: `http://127.0.0.1:${process.env.PORT ?? 5180}`, changeOrigin: false } },
  },
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: false, chunkSizeWarningLimit: 700 },
});
