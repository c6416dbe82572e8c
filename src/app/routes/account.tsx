import { PageHeader } from '@/components/ui/app-shell.tsx';
import { SiteRoleBadge } from '@/components/ui/badge.tsx';
import { ThemeToggle } from '@/components/ui/theme-toggle.tsx';
import { AccountNameForm, ChangePasswordForm } from '@/features/auth/components/account-forms.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';
import { useSession } from './use-session.ts';

export default function AccountRoute() {
  useDocumentTitle('Account');
  const { user } = useSession();
  return (
    <>
      <PageHeader eyebrow="Account" title={user.name}>
        <span className="inline-flex items-center gap-2">
          Site role: <SiteRoleBadge role={user.siteRole} />
        </span>
      </PageHeader>
      <div className="grid gap-8 md:grid-cols-2">
        <section aria-labelledby="name-heading" className="rounded-lg border border-rule bg-surface p-6">
          <h2 id="name-heading" className="mb-4 text-base font-semibold">
            Your name
          </h2>
          <AccountNameForm key={user.name} user={user} />
        </section>
        <section aria-labelledby="password-heading" className="rounded-lg border border-rule bg-surface p-6">
          <h2 id="password-heading" className="mb-4 text-base font-semibold">
            Password
          </h2>
          <ChangePasswordForm />
        </section>
        <section aria-labelledby="look-heading" className="rounded-lg border border-rule bg-surface p-6">
          <h2 id="look-heading" className="mb-2 text-base font-semibold">
            Appearance
          </h2>
          <p className="mb-3 text-sm text-ink-muted">
            Light, dark, or follow this device. Remembered in this browser.
          </p>
          <ThemeToggle />
        </section>
      </div>
    </>
  );
}
