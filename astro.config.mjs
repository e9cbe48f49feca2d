// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

export default defineConfig({
  output: 'server',
  // Middleware mode: scripts/serve.ts mounts the handler in Express behind multer.
  adapter: node({ mode: 'middleware' }),
  integrations: [react()],
  devToolbar: { enabled: false },
  security: {
    checkOrigin: true,
    allowedDomains: [{ hostname: '127.0.0.1' }, { hostname: 'localhost' }],
  },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['mariadb', 'sequelize', 'piscina', 'openchemlib', 'nodemailer', 'smtp-server', 'mailparser', 'playwright-core'] },
  },
});
