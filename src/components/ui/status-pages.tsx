import { Component, type ErrorInfo, type ReactNode } from 'react';
import { paths } from '@/config/paths.ts';
import { ButtonLink } from './button.tsx';

function StatusPage({ code, title, children }: { code: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby="status-title" className="mx-auto max-w-xl py-12 text-center">
      <p className="figures text-sm font-medium tracking-widest text-ink-muted">{code}</p>
      <h1 id="status-title" className="mt-2 font-serif text-3xl font-bold text-ink">
        {title}
      </h1>
      <div className="mt-3 font-serif leading-relaxed text-ink-muted">{children}</div>
      <div className="mt-8">
        <ButtonLink to={paths.notebooks.getHref()} variant="secondary">
          Back to your notebooks
        </ButtonLink>
      </div>
    </section>
  );
}

export function NotFound() {
  return (
    <StatusPage code="404" title="Page not found">
      There is nothing here, or it belongs to a notebook you are not a member of. Check the address, or ask
      the notebook&apos;s principal investigator to add you.
    </StatusPage>
  );
}

export function Refused() {
  return (
    <StatusPage code="403" title="Not available to you">
      This page is for site administrators. If you need something changed here, ask one of them.
    </StatusPage>
  );
}

export function Broken({ message }: { message?: string }) {
  return (
    <StatusPage code="Error" title="This page stopped working">
      Something unexpected went wrong while showing it. Reloading usually helps; your saved work is not
      affected.
      {message && <span className="mt-3 block font-mono text-xs">{message}</span>}
    </StatusPage>
  );
}

/** Catches rendering errors below it and shows a plain explanation instead of a blank page. */
export class ErrorBoundary extends Component<
  { children: ReactNode; fallback?: ReactNode },
  { error: Error | null }
> {
  override state = { error: null as Error | null };
  static getDerivedStateFromError(error: Error) {
    return { error };
  }
  override componentDidCatch(error: Error, info: ErrorInfo) {
    console.error('Unhandled rendering error', error, info.componentStack);
  }
  override render() {
    if (this.state.error) return this.props.fallback ?? <Broken message={this.state.error.message} />;
    return this.props.children;
  }
}
