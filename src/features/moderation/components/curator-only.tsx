import type { ReactNode } from 'react';
import type { CurrentUser } from '@shared/schemas/auth';
import { useMe } from '@/features/auth/api/get-me';

/**
 * Curation is for moderators who are nobody's maker staff: the server refuses
 * staff of any maker (merges and hidden models change statistics), so the tools
 * are not offered to them either.
 */
export function canCurate(me: CurrentUser | null | undefined): boolean {
  return !!me && me.roles.includes('moderator') && me.makerIds.length === 0;
}

export function CuratorOnly({ children }: { children: ReactNode }) {
  const me = useMe();
  return canCurate(me.data) ? children : null;
}
