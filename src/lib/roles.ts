// The one table of what each role may do (API.md, "Roles and what they allow").
export const ROLES = ['viewer', 'analyst', 'curator', 'auditor', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const CAPABILITIES = ['read', 'search', 'report', 'curate', 'approve', 'audit', 'admin'] as const;
export type Capability = (typeof CAPABILITIES)[number];

const GRANTS: Record<Role, readonly Capability[]> = {
  viewer: ['read'],
  analyst: ['read', 'search', 'report'],
  curator: ['read', 'search', 'report', 'curate', 'approve'],
  auditor: ['read', 'search', 'audit'],
  // Separation of duties: admin alone grants no right to approve data.
  admin: ['read', 'audit', 'admin'],
};

export function parseRoles(value: string | readonly string[] | null | undefined): Role[] {
  const list = Array.isArray(value) ? value : String(value ?? '').split(',');
  return ROLES.filter((r) => list.map((s) => String(s).trim()).includes(r));
}

export function capabilitiesOf(roles: readonly Role[]): Set<Capability> {
  const caps = new Set<Capability>();
  for (const r of roles) for (const c of GRANTS[r] ?? []) caps.add(c);
  return caps;
}

export function can(roles: readonly Role[] | null | undefined, capability: Capability): boolean {
  return !!roles && capabilitiesOf(roles).has(capability);
}

/** Where a role lands after signing in. */
export function homePathFor(roles: readonly Role[]): string {
  if (can(roles, 'search')) return '/identify';
  if (can(roles, 'admin') && !can(roles, 'curate')) return '/admin';
  return '/library';
}
