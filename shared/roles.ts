import { createAccessControl } from 'better-auth/plugins/access';

/** What each resource allows. One table read by both the server (authorization) and the client (hiding controls). */
export const statements = {
  job: ['read', 'create', 'update'],
  measurement: ['read', 'write'],
  sheet: ['read', 'write', 'issue'],
  incoming: ['read', 'respond'],
  summary: ['read', 'approve'],
  shop: ['update', 'invite'],
  // The sign-in library's own names for the team: it checks these when a builder or grinder manages members and invitations.
  member: ['update', 'delete'],
  invitation: ['create', 'cancel'],
} as const;

export const accessControl = createAccessControl(statements);

export const shopRoles = {
  builder: accessControl.newRole({
    job: ['read', 'create', 'update'],
    measurement: ['read', 'write'],
    sheet: ['read', 'write', 'issue'],
    shop: ['update', 'invite'],
    member: ['update', 'delete'],
    invitation: ['create', 'cancel'],
  }),
  tech: accessControl.newRole({
    job: ['read'],
    measurement: ['read', 'write'],
    sheet: ['read'],
  }),
  grinder: accessControl.newRole({
    incoming: ['read', 'respond'],
    shop: ['update', 'invite'],
    member: ['update', 'delete'],
    invitation: ['create', 'cancel'],
  }),
  customer: accessControl.newRole({
    summary: ['read', 'approve'],
  }),
};

export type ShopRole = keyof typeof shopRoles;
export const shopRoleNames = Object.keys(shopRoles) as ShopRole[];
export type Resource = keyof typeof statements;
export type Permission = { [R in Resource]?: (typeof statements)[R][number][] };

export const shopKinds = ['repair', 'grinding'] as const;
export type ShopKind = (typeof shopKinds)[number];

export function isShopRole(value: string): value is ShopRole {
  return value in shopRoles;
}

/** True when the role grants every action listed. */
export function roleAllows(role: string | null | undefined, permission: Permission): boolean {
  if (!role || !isShopRole(role)) return false;
  return shopRoles[role].authorize(permission).success;
}

/** The roles a shop of each kind gives its staff (vehicle owners join through a share link, not the team screen). */
export const staffRoles = {
  repair: ['builder', 'tech'],
  grinding: ['grinder'],
} as const satisfies Record<ShopKind, readonly ShopRole[]>;

/** True when `role` is one this kind of shop gives its staff; a vehicle owner's or another kind's role is not. */
export function isStaffRole(kind: ShopKind, role: string | null | undefined): role is ShopRole {
  const staff: readonly string[] = staffRoles[kind];
  return typeof role === 'string' && staff.includes(role);
}

/** The role an invitation offers unless the manager picks another: the least one this kind of shop gives. */
export const defaultStaffRole = {
  repair: 'tech',
  grinding: 'grinder',
} as const satisfies Record<ShopKind, ShopRole>;

export const roleLabels: Record<ShopRole, string> = {
  builder: 'Builder',
  tech: 'Technician',
  grinder: 'Grinder',
  customer: 'Vehicle owner',
};

/** True for whoever manages a shop's team: a builder of a repair shop, a grinder of a grinding shop. */
export function managesTeam(kind: ShopKind, role: string | null | undefined): boolean {
  return isStaffRole(kind, role) && roleAllows(role, { invitation: ['create', 'cancel'], member: ['update', 'delete'] });
}
