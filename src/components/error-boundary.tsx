import { Component, type ErrorInfo, type ReactNode } from 'react';

type Props = {
  children: ReactNode;
  /** What to show instead of the children after a render error. */
  fallback: (reset: () => void) => ReactNode;
};

type State = { failed: boolean };

/** Catches render errors below it and shows a friendly fallback instead of a blank page. */
export class ErrorBoundary extends Component<Props, State> {
  override state: State = { failed: false };

  static getDerivedStateFromError(): State {
    return { failed: true };
  }

  override componentDidCatch(error: Error, info: ErrorInfo): void {
    // Kept for developers in the console; the page shows no stack.
    console.warn('Parley hit a render error', error, info.componentStack);
  }

  override render(): ReactNode {
    if (this.state.failed) return this.props.fallback(() => this.setState({ failed: false }));
    return this.props.children;
  }
}
