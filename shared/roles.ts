// The roles a person can hold. Maker staff is not a role: it is a membership of
// exactly one maker, verified by an admin (see makerIds on the signed-in user).
export const ROLES = ['rider', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Roles an admin can grant or revoke; every account is a rider. */
export const GRANTABLE_ROLES = ['moderator', 'admin'] as const satisfies readonly Role[];
export type GrantableRole = (typeof GRANTABLE_ROLES)[number];

export const DELETED_RIDER_NAME = 'deleted rider';
