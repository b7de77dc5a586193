import { Component, type ReactNode } from 'react';

/** Keeps a part of a page that fails (a chart, a comment thread) from taking the page down. */
export class LocalBoundary extends Component<{ what: string; children: ReactNode }, { error: Error | null }> {
  override state = { error: null as Error | null };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  override render() {
    if (this.state.error) {
      return (
        <p role="alert" className="rounded border border-fail bg-fail-soft p-3 text-sm">
          The {this.props.what} could not be shown: {this.state.error.message}
        </p>
      );
    }
    return this.props.children;
  }
}
