// Who is calling: a session cookie or an API key, resolved to a user with roles.
// src/lib/auth.ts provides the resolver; this indirection keeps the middleware
// free of better-auth details.
import type { Role } from './roles';

export interface Principal {
  user: { id: string; email: string; name: string; roles: Role[] };
  session: { id: string; expiresAt: Date } | null;
  apiKeyId: string | null;
}

export type PrincipalResolver = (request: Request) => Promise<Principal | null>;

let resolver: PrincipalResolver = async () => null;

export function setPrincipalResolver(r: PrincipalResolver): void {
  resolver = r;
}

export function resolvePrincipal(request: Request): Promise<Principal | null> {
  return resolver(request);
}
