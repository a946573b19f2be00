/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('./lib/auth/auth').SessionData['user'] | null;
    session: import('./lib/auth/auth').SessionData['session'] | null;
    workspace: import('./lib/db/workspaces').WorkspaceContext | null;
  }
}
