import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Link, NavLink } from 'react-router';
import { SITE_ROLE_LABELS, type SiteRole } from '@shared/domain/roles.ts';
import { paths } from '@/config/paths.ts';
import { CautionFooter } from './caution.tsx';
import { cn } from './cn.ts';
import { Wordmark } from './logo.tsx';
import { ThemeToggle } from './theme-toggle.tsx';

export type ShellUser = { id: string; name: string; email: string; siteRole: SiteRole };

const navClass = ({ isActive }: { isActive: boolean }) =>
  cn(
    'rounded-md px-3 py-1.5 text-sm font-medium no-underline',
    isActive ? 'bg-accent-soft text-ink' : 'text-ink-muted hover:bg-sunken hover:text-ink',
  );

function UserMenu({
  user,
  onSignOut,
  signingOut,
}: {
  user: ShellUser;
  onSignOut: () => void;
  signingOut: boolean;
}) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  const trigger = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    if (!open) return;
    const onDoc = (e: MouseEvent) => {
      if (!ref.current?.contains(e.target as Node)) setOpen(false);
    };
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') {
        setOpen(false);
        trigger.current?.focus();
      }
    };
    document.addEventListener('mousedown', onDoc);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('mousedown', onDoc);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);
  const initials = user.name
    .split(/\s+/)
    .filter((w) => /^[A-Za-z]/.test(w) && !/\.$/.test(w))
    .map((w) => w[0])
    .slice(0, 2)
    .join('');
  return (
    <div ref={ref} className="relative">
      <button
        ref={trigger}
        type="button"
        aria-expanded={open}
        aria-haspopup="true"
        onClick={() => setOpen((o) => !o)}
        className="flex items-center gap-2 rounded-md px-2 py-1 text-sm text-ink hover:bg-sunken"
      >
        <span
          aria-hidden="true"
          className="grid size-7 place-items-center rounded-full bg-accent text-xs font-semibold text-on-accent"
        >
          {initials || '·'}
        </span>
        <span className="hidden sm:inline">{user.name}</span>
        <span className="sr-only">: account menu</span>
      </button>
      {open && (
        <div className="absolute right-0 z-40 mt-2 w-64 rounded-lg border border-rule bg-surface p-2 shadow-xl">
          <div className="border-b border-rule px-2 pb-2">
            <p className="truncate text-sm font-medium text-ink">{user.name}</p>
            <p className="truncate text-xs text-ink-muted">{user.email}</p>
            <p className="mt-1 text-xs text-ink-muted">{SITE_ROLE_LABELS[user.siteRole]}</p>
          </div>
          <div className="flex flex-col py-1">
            <Link
              to={paths.account.getHref()}
              onClick={() => setOpen(false)}
              className="rounded-md px-2 py-1.5 text-sm text-ink no-underline hover:bg-sunken hover:text-ink"
            >
              Account
            </Link>
            <button
              type="button"
              onClick={onSignOut}
              disabled={signingOut}
              className="rounded-md px-2 py-1.5 text-left text-sm text-ink hover:bg-sunken"
            >
              Sign out
            </button>
          </div>
          <div className="border-t border-rule px-2 pt-2">
            <ThemeToggle />
          </div>
        </div>
      )}
    </div>
  );
}

/** The top bar: the mark (linking home), then whatever the page puts beside it. */
export function SiteHeader({ children }: { children: ReactNode }) {
  return (
    <header className="border-b border-rule bg-surface">
      <div className="mx-auto flex max-w-6xl items-center gap-4 px-4 py-2.5 sm:px-6">
        <Link
          to={paths.notebooks.getHref()}
          className="rounded-md no-underline"
          aria-label="Bifolio: your notebooks"
        >
          <Wordmark />
        </Link>
        {children}
      </div>
    </header>
  );
}

/** Header with the mark, the main navigation and the person's menu; the caution in the footer. */
export function AppShell({
  user,
  onSignOut,
  signingOut,
  showOutbox,
  children,
}: {
  user: ShellUser;
  onSignOut: () => void;
  signingOut: boolean;
  showOutbox: boolean;
  children: ReactNode;
}) {
  const admin = user.siteRole === 'administrator';
  return (
    <div className="flex min-h-screen flex-col bg-paper">
      <a
        href="#main"
        className="sr-only rounded-md bg-accent px-3 py-2 text-on-accent focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50"
      >
        Skip to content
      </a>
      <SiteHeader>
        <nav aria-label="Main" className="flex flex-1 flex-wrap items-center gap-1">
          <NavLink to={paths.notebooks.getHref()} end className={navClass}>
            Notebooks
          </NavLink>
          <NavLink to={paths.search.getHref()} className={navClass}>
            Search
          </NavLink>
          <NavLink to={paths.reviewQueue.getHref()} className={navClass}>
            Reviews
          </NavLink>
          <NavLink to={paths.audit.getHref({ actorId: user.id })} className={navClass}>
            My activity
          </NavLink>
          <NavLink to={paths.methods.getHref()} className={navClass}>
            Methods
          </NavLink>
          {admin && (
            <>
              <NavLink to={paths.adminUsers.getHref()} className={navClass}>
                People
              </NavLink>
              <NavLink to={paths.adminInvites.getHref()} className={navClass}>
                Invites
              </NavLink>
            </>
          )}
          {showOutbox && (
            <NavLink to={paths.outbox.getHref()} className={navClass}>
              Outbox
            </NavLink>
          )}
        </nav>
        <UserMenu user={user} onSignOut={onSignOut} signingOut={signingOut} />
      </SiteHeader>
      <main
        id="main"
        tabIndex={-1}
        className="mx-auto w-full max-w-6xl flex-1 px-4 py-8 outline-none sm:px-6"
      >
        {children}
      </main>
      <CautionFooter>
        <nav aria-label="Footer" className="mt-2">
          <p>
            <Link to={paths.methods.getHref()}>Methods</Link>: what each cell computes, its conventions
            and sources.
          </p>
        </nav>
      </CautionFooter>
    </div>
  );
}

/** The frame for pages seen before signing in. */
export function PublicShell({
  title,
  intro,
  children,
}: {
  title: string;
  intro?: ReactNode;
  children: ReactNode;
}) {
  return (
    <div className="flex min-h-screen flex-col bg-paper">
      <main id="main" className="flex flex-1 items-start justify-center px-4 pt-[10vh] pb-12">
        <div className="w-full max-w-md">
          <div className="mb-6 flex items-center justify-between">
            <Wordmark />
            <ThemeToggle />
          </div>
          <div className="rounded-lg border border-rule bg-surface p-7 shadow-sm">
            <h1 className="font-serif text-2xl font-bold text-ink">{title}</h1>
            {intro && (
              <div className="mt-2 mb-5 font-serif text-sm leading-relaxed text-ink-muted">{intro}</div>
            )}
            {!intro && <div className="mb-5" />}
            {children}
          </div>
        </div>
      </main>
      <CautionFooter />
    </div>
  );
}

export function PageHeader({
  title,
  eyebrow,
  actions,
  children,
}: {
  title: string;
  eyebrow?: string;
  actions?: ReactNode;
  children?: ReactNode;
}) {
  return (
    <div className="mb-8 flex flex-wrap items-end justify-between gap-4 border-b border-rule pb-5">
      <div>
        {eyebrow && (
          <p className="mb-1 text-xs font-semibold tracking-widest text-ink-muted uppercase">{eyebrow}</p>
        )}
        <h1 className="font-serif text-3xl font-bold text-ink">{title}</h1>
        {children && (
          <div className="mt-2 max-w-prose font-serif text-sm leading-relaxed text-ink-muted">{children}</div>
        )}
      </div>
      {actions}
    </div>
  );
}
