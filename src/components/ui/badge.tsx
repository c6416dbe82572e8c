import {
  NOTEBOOK_ROLE_LABELS,
  SITE_ROLE_LABELS,
  type NotebookRole,
  type SiteRole,
} from '@shared/domain/roles.ts';
import { cn } from './cn.ts';

export type BadgeTone = 'neutral' | 'accent' | 'stable' | 'unstable' | 'warning' | 'success';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-sunken text-ink-muted ring-rule',
  accent: 'bg-accent-soft text-accent ring-accent/30',
  stable: 'bg-stable-soft text-stable ring-stable/30',
  unstable: 'bg-unstable-soft text-unstable ring-unstable/30',
  warning: 'bg-warning-soft text-warning ring-warning/30',
  success: 'bg-success-soft text-success ring-success/30',
};

export function Badge({
  tone = 'neutral',
  children,
  className,
}: {
  tone?: BadgeTone;
  children: React.ReactNode;
  className?: string;
}) {
  return (
    <span
      className={cn(
        'inline-flex items-center rounded-sm px-1.5 py-0.5 text-xs font-medium whitespace-nowrap ring-1 ring-inset',
        tones[tone],
        className,
      )}
    >
      {children}
    </span>
  );
}

const notebookRoleTone: Record<NotebookRole, BadgeTone> = {
  pi: 'accent',
  researcher: 'stable',
  reader: 'neutral',
};

export function NotebookRoleBadge({ role }: { role: NotebookRole }) {
  return <Badge tone={notebookRoleTone[role]}>{NOTEBOOK_ROLE_LABELS[role]}</Badge>;
}

export function SiteRoleBadge({ role }: { role: SiteRole }) {
  return <Badge tone={role === 'administrator' ? 'warning' : 'neutral'}>{SITE_ROLE_LABELS[role]}</Badge>;
}

export function ActiveBadge({ active }: { active: boolean }) {
  return <Badge tone={active ? 'success' : 'unstable'}>{active ? 'Active' : 'Deactivated'}</Badge>;
}
