import { Component, type ReactNode } from 'react';

/** Keeps one broken panel (canvas, audio) from blanking the whole page. */
export class ErrorBoundary extends Component<{ title: string; children: ReactNode }, { error: Error | null }> {
  override state = { error: null as Error | null };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  override render() {
    if (!this.state.error) return this.props.children;
    return (
      <div role="alert" className="rounded-md border border-ember-500/50 bg-ember-500/10 p-3 text-sm">
        <p className="font-semibold">{this.props.title} stopped working</p>
        <p className="mt-1">{this.state.error.message}</p>
        <button type="button" className="mt-2 underline" onClick={() => this.setState({ error: null })}>
          Try again
        </button>
      </div>
    );
  }
}
