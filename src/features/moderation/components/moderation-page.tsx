import type { ReactNode } from 'react';
import { SectionPage } from '@/components/ui/section-page';
import { RequireAccess } from '@/features/auth/components/require-access';

const moderationPages = [
  { to: '/moderation', label: 'Review queue', end: true },
  { to: '/moderation/catalogue', label: 'Catalogue' },
];

/** The moderators' list pages: moderators only, in the moderation section's frame. */
export function ModerationPage({ title, intro, children }: { title: string; intro: string; children: ReactNode }) {
  return (
    <RequireAccess roles={['moderator']}>
      {() => (
        <SectionPage section="Moderation" links={moderationPages} title={title} intro={intro}>
          {children}
        </SectionPage>
      )}
    </RequireAccess>
  );
}
