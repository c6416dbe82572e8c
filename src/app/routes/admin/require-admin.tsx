import type { ReactNode } from 'react';
import { Refused } from '@/components/ui/status-pages.tsx';
import { useSession } from '../use-session.ts';

/** Administration pages refuse everyone else (the server refuses their requests too). */
export function RequireAdmin({ children }: { children: ReactNode }) {
  const { user } = useSession();
  return user.siteRole === 'administrator' ? <>{children}</> : <Refused />;
}
