/**
 * Who may do what, per team role. The one permission table: the server enforces it on every
 * route, the client reads it only to hide controls a member cannot use.
 */

export const ROLES = ['designer', 'checker', 'fabricator', 'lead', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ACTIONS = [
  /** Create spools and edit their elements and design conditions. */
  'spool:edit',
  /** View spools, checks and the equation trail; read revisions and history. */
  'spool:view',
  /** Comment on elements. */
  'spool:comment',
  /** draft → submitted. */
  'spool:submit',
  /** submitted → checked, or return submitted → draft with comments. */
  'spool:check',
  /** checked → released (approve for fabrication). */
  'spool:release',
  /** Soft-delete a spool. */
  'spool:delete',
  /** Bend thinning sheet and cut list. */
  'sheet:view',
  /** Create and revoke share links. */
  'share:manage',
  /** Manage team members and their roles. */
  'team:manage',
  /** Edit the team's materials library. */
  'materials:manage',
  /** Read the development mail outbox. */
  'outbox:read',
] as const;
export type Action = (typeof ACTIONS)[number];

const everyone: readonly Role[] = ROLES;

/** Roles allowed per action (the product's roles table; "owner/admin" is `admin`). */
export const PERMISSIONS: Readonly<Record<Action, readonly Role[]>> = {
  'spool:edit': ['designer', 'lead', 'admin'],
  'spool:view': everyone,
  'spool:comment': everyone,
  'spool:submit': ['designer', 'lead', 'admin'],
  'spool:check': ['checker', 'lead', 'admin'],
  'spool:release': ['lead', 'admin'],
  'spool:delete': ['lead', 'admin'],
  'sheet:view': everyone,
  'share:manage': ['lead', 'admin'],
  'team:manage': ['admin'],
  'materials:manage': ['admin'],
  'outbox:read': ['admin'],
};

export const isRole = (value: unknown): value is Role =>
  typeof value === 'string' && (ROLES as readonly string[]).includes(value);

/** True when a member with `role` may perform `action`; no role (not a member) may do nothing. */
export function can(role: Role | null | undefined, action: Action): boolean {
  if (role === null || role === undefined) return false;
  return PERMISSIONS[action].includes(role);
}

/** Every action a role may perform, in table order. */
export function listPermissions(role: Role | null | undefined): Action[] {
  return ACTIONS.filter((a) => can(role, a));
}

export const SPOOL_STATUSES = ['draft', 'submitted', 'checked', 'released'] as const;
export type SpoolStatus = (typeof SPOOL_STATUSES)[number];

/** Allowed lifecycle moves and the action each needs. Editing a checked/released spool is not a
 * transition: it opens a new revision in draft. */
export const TRANSITIONS: readonly { from: SpoolStatus; to: SpoolStatus; action: Action }[] = [
  { from: 'draft', to: 'submitted', action: 'spool:submit' },
  { from: 'submitted', to: 'checked', action: 'spool:check' },
  { from: 'submitted', to: 'draft', action: 'spool:check' },
  { from: 'checked', to: 'released', action: 'spool:release' },
];

/** The transition rule for `from → to`, or undefined when the move is not allowed. */
export function findTransition(from: SpoolStatus, to: SpoolStatus) {
  return TRANSITIONS.find((t) => t.from === from && t.to === to);
}
