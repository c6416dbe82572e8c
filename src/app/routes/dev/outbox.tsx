import { Outlet, useParams } from 'react-router';
import { SiteHeader } from '@/components/ui/app-shell.tsx';
import { CautionFooter } from '@/components/ui/caution.tsx';
import { ThemeToggle } from '@/components/ui/theme-toggle.tsx';
import { OutboxList } from '@/features/outbox/components/outbox-list.tsx';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

/** Mail this installation "sent", kept locally: development and demo installations only. */
export default function OutboxRoute() {
  useDocumentTitle('Outbox');
  const { messageId } = useParams();
  return (
    <div className="flex min-h-screen flex-col bg-paper">
      <SiteHeader>
        <span className="flex-1 text-sm text-ink-muted">Local outbox</span>
        <ThemeToggle />
      </SiteHeader>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-8 sm:px-6">
        <h1 className="font-serif text-3xl font-bold text-ink">Outbox</h1>
        <p className="mt-2 mb-6 max-w-prose font-serif text-sm text-ink-muted">
          This installation does not send real mail. Invites and password-reset messages land here so you can
          follow their links.
        </p>
        <div className="grid gap-6 lg:grid-cols-[22rem_minmax(0,1fr)]">
          <OutboxList />
          <div>
            {messageId ? <Outlet /> : <p className="text-sm text-ink-muted">Choose a message to read it.</p>}
          </div>
        </div>
      </main>
      <CautionFooter />
    </div>
  );
}
