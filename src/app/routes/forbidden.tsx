import { NotAllowed } from '@/features/auth/components/not-allowed';

export function ForbiddenRoute() {
  return <NotAllowed />;
}
