import { Component, type ErrorInfo, type ReactNode } from 'react';

/** One cell failing to draw never takes the entry down with it. */
export class CellErrorBoundary extends Component<
  { children: ReactNode; resetKey: string },
  { error: Error | null; key: string }
> {
  override state = { error: null as Error | null, key: this.props.resetKey };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  static getDerivedStateFromProps(props: { resetKey: string }, state: { error: Error | null; key: string }) {
    return props.resetKey !== state.key ? { error: null, key: props.resetKey } : null;
  }

  override componentDidCatch(error: Error, info: ErrorInfo) {
    console.error('A cell failed to draw', error, info.componentStack);
  }

  override render() {
    if (this.state.error) {
      return (
        <div role="alert" className="rounded-md border border-unstable bg-unstable-soft px-4 py-3 text-sm">
          <p className="font-semibold text-unstable">This cell could not be drawn.</p>
          <p className="mt-1 text-ink">{this.state.error.message}</p>
          <p className="mt-1 text-xs text-ink-muted">
            The entry and the cell’s input are safe; changing the input or reloading redraws it.
          </p>
        </div>
      );
    }
    return this.props.children;
  }
}
