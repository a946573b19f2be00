// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

// Server-rendered app on the Node adapter in standalone mode, served by `node src/scripts/serve.mjs` (it fixes the client address first)
// honours HOST and PORT. Origin checks on state-changing requests are done by our own
// middleware against the configured APP_URL (see DEVELOPERS.md, Decisions), because Astro's
// built-in check is fixed at build time and the deployment's host is only known at run time.
// VARLEDGER_DIST lets parallel local runs build into separate folders (CI and npm start use dist/).
export default defineConfig({
  output: 'server',
  outDir: process.env.VARLEDGER_DIST ?? './dist',
  adapter: node({ mode: 'standalone' }),
  integrations: [react()],
  security: { checkOrigin: false },
  devToolbar: { enabled: false },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['@libsql/client', 'libsql', 'nodemailer', 'maildev', 'pdfkit', 'exceljs', 'stripe'] },
  },
});
