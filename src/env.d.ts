/// <reference types="astro/client" />
declare namespace App {
  interface Locals {
    user: { id: string; email: string; name: string; roles: import('./lib/roles').Role[] } | null;
    session: { id: string; expiresAt: Date } | null;
    /** Set when the request was authenticated with an API key instead of a session. */
    apiKeyId?: string | null;
    /** Files multer stored for POST /api/imports (scripts/serve.ts). */
    uploads?: { originalname: string; path: string; size: number }[];
    uploadFields?: Record<string, string>;
    uploadError?: { status: number; code: string; message: string } | null;
  }
}
