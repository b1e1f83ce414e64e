/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    viewer: import('./lib/auth/viewer').Viewer | null;
    ip: string;
    userAgent: string | null;
  }
}
