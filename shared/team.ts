import { z } from 'zod';

import { emailAddress } from './me';
import { shopRoleNames, type ShopRole } from './roles';

/** One person on a shop's staff, as the team screen lists them. */
export type TeamMember = {
  /** The membership's id (what role changes and removals name). */
  id: string;
  userId: string;
  name: string;
  email: string;
  role: ShopRole;
  joinedAt: string;
  you: boolean;
};

/** An invitation still waiting for its person. */
export type TeamInvitation = {
  id: string;
  email: string;
  role: ShopRole;
  expiresAt: string;
  invitedBy: string | null;
};

export type Team = {
  members: TeamMember[];
  invitations: TeamInvitation[];
  /** The roles this shop's kind can give its staff. */
  roles: ShopRole[];
  /** The role a new invitation offers unless the manager picks another. */
  defaultRole: ShopRole;
};

const roleField = z.enum(shopRoleNames, { error: 'Choose a role' });

export const inviteSchema = z.strictObject({
  email: emailAddress,
  role: roleField,
});
export type InviteInput = z.input<typeof inviteSchema>;

export const memberRoleSchema = z.strictObject({ role: roleField });

/** An invitation as the person it was sent to sees it. */
export type InvitationView = {
  id: string;
  shopName: string;
  role: ShopRole;
  status: 'pending' | 'accepted' | 'rejected' | 'canceled' | 'expired';
  expiresAt: string;
  /** False until the signed-in person has verified their address: accepting waits for it. */
  verified: boolean;
};
