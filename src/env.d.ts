/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('./server/auth/users').CurrentUser | null;
    session: import('./server/auth/session').SessionInfo | null;
    /** Why a page guard refused, shown on the 403 page. */
    denied?: string;
  }
}
