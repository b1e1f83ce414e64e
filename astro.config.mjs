import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'astro/config';

const port = Number(process.env.PORT ?? 4321);
const publicUrl = new URL(process.env.PUBLIC_URL ?? `http://localhost:${port}`);

export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'standalone' }),
  integrations: [react()],
  outDir: process.env.KINLOOP_BUILD_DIR ?? './dist',
  server: { port, host: '127.0.0.1' },
  security: {
    // Astro's own check stays on for form posts. Without allowedDomains the
    // server ignores the Host header, believes it is http://localhost and
    // refuses every browser form and multipart POST. Port-less patterns let two
    // instances on different ports share one build.
    checkOrigin: true,
    allowedDomains: [
      { hostname: publicUrl.hostname, protocol: publicUrl.protocol.replace(':', '') },
      { hostname: 'localhost', protocol: 'http' },
      { hostname: '127.0.0.1', protocol: 'http' },
    ],
  },
  experimental: {
    // Astro hashes every script and style it emits into the page's
    // Content-Security-Policy header, so script-src needs no 'unsafe-inline'.
    // These are the other directives of every page; the middleware adds
    // style-src-attr for the two bars sized by a style attribute.
    csp: {
      directives: [
        "default-src 'self'",
        "img-src 'self' data: blob:",
        "font-src 'self'",
        "connect-src 'self'",
        "object-src 'none'",
        "base-uri 'self'",
        "form-action 'self'",
        "frame-ancestors 'none'",
      ],
    },
  },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['@node-rs/argon2', 'pg-boss', 'pg', 'knex', 'pg-copy-streams', 'nodemailer', 'pdfkit', 'fontkit'] },
    optimizeDeps: { exclude: ['@node-rs/argon2'] },
  },
});
