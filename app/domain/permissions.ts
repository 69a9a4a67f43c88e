// Who may do what: the one permission map. Routes never decide access themselves; they call
// requireUser / requirePermission (app/services/session.server.ts), which read this map.

export const ROLES = ["member", "moderator", "secretary", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  member: "Member",
  moderator: "Moderator",
  secretary: "Class secretary",
  admin: "Administrator",
};

export const PERMISSIONS = {
  "writeup:write": ["member"],
  "space:measure": ["member"],
  "space:moderate-measurements": ["moderator", "admin"],
  "boat:register": ["member"],
  "writeup:review": ["moderator", "admin"],
  "digest:compile": ["secretary", "admin"],
  "tag:manage": ["admin"],
  "class:configure": ["admin"],
  "user:manage": ["admin"],
  "mail:inspect": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(roles: readonly Role[], permission: Permission): boolean {
  const allowed: readonly Role[] = PERMISSIONS[permission];
  return roles.some((r) => allowed.includes(r));
}

/** A measurement of a space is changed or removed by the member who took it, or by a moderator or an administrator. */
export function canChangeMeasurement(user: { id: number; roles: readonly Role[] }, takenBy: number): boolean {
  return (user.id === takenBy && can(user.roles, "space:measure")) || can(user.roles, "space:moderate-measurements");
}

export function isRole(value: string): value is Role {
  return (ROLES as readonly string[]).includes(value);
}
