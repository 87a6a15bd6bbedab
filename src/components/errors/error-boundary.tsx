/**
 * The last line of defence above the router: if rendering fails outside any route's own
 * errorElement, show a calm page with a reload button instead of a blank window.
 */
import { Component, type ErrorInfo, type ReactNode } from "react";

interface Props {
  children: ReactNode;
}
interface State {
  error: Error | null;
}

export class AppErrorBoundary extends Component<Props, State> {
  state: State = { error: null };

  static getDerivedStateFromError(error: Error): State {
    return { error };
  }

  componentDidCatch(error: Error, info: ErrorInfo): void {
    // The console is where a developer or a bug report will look; there is no client log sink yet.
    console.error("Phasebook crashed while rendering", error, info.componentStack);
  }

  render() {
    if (!this.state.error) return this.props.children;
    return (
      <div role="alert" className="mx-auto max-w-lg px-4 py-16 text-center">
        <h1 className="text-lg font-semibold text-grey-900">Phasebook stopped working on this page</h1>
        <p className="mt-2 text-grey-600">Reloading usually helps. If it keeps happening, tell the facility staff what you were doing.</p>
        <pre className="mt-4 overflow-x-auto rounded-md bg-grey-100 p-3 text-left font-mono text-xs text-grey-700">
          {this.state.error.message}
        </pre>
        <button
          type="button"
          onClick={() => window.location.reload()}
          className="mt-4 inline-flex h-8 items-center rounded-md bg-aqueous-700 px-3 font-medium text-white hover:bg-aqueous-800"
        >
          Reload the page
        </button>
      </div>
    );
  }
}
