/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    viewer: import('./lib/auth/viewer').Viewer | null;
    ip: string;
    userAgent: string | null;
    /** The trusted-device cookie of the request, if valid (see src/lib/auth/rate-limit.ts). */
    device: import('./lib/auth/cookie').TrustedDevice | null;
  }
}
