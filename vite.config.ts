import { defineConfig } from 'vite'
import react from '@vitejs/plugin-react'
import tailwindcss from '@tailwindcss/vite'
import { fileURLToPath } from 'node:url'

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url))

export const alias = {
  '@': r('./src'),
  '@shared': r('./shared'),
  '@server': r('./server'),
  '@tests': r('./tests'),
  '@templates': r('./templates'),
}

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias },
  build: {
    outDir: 'dist/client',
    emptyOutDir: true,
    sourcemap: false,
    chunkSizeWarningLimit: 600,
    // Fonts stay files: the content security policy allows fonts from 'self', not data: URIs.
    assetsInlineLimit: (file: string) => (/\.(woff2?|ttf)$/.test(file) ? false : undefined),
  },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { '/api': { target: process.env.API_URL ?? 'http://127.0.0.1:3000', changeOrigin: false } },
  },
})
