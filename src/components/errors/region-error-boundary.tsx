import { Component, type ErrorInfo, type ReactNode } from 'react';
import { QueryErrorResetBoundary } from '@tanstack/react-query';
import { Button } from '@/components/ui/button';
import { ProblemNote } from '@/components/ui/problem-note';

export interface RegionErrorBoundaryProps {
  /** Names the region in the message, e.g. "People". */
  region: string;
  children: ReactNode;
}

interface BoundaryState {
  error: Error | null;
}

class Boundary extends Component<{ region: string; onReset: () => void; children: ReactNode }, BoundaryState> {
  state: BoundaryState = { error: null };

  static getDerivedStateFromError(error: Error): BoundaryState {
    return { error };
  }

  componentDidCatch(error: Error, info: ErrorInfo) {
    console.error(`[paraxia] ${this.props.region} failed to render`, error, info.componentStack);
  }

  reset = () => {
    this.props.onReset();
    this.setState({ error: null });
  };

  render() {
    if (this.state.error) {
      return (
        <ProblemNote
          title={`${this.props.region} could not be shown`}
          message="Something went wrong while drawing this part of the page. The rest of Paraxia still works; try again, and if it happens again tell your administrator what you were doing."
          action={
            <Button variant="secondary" size="sm" onClick={this.reset}>
              Try again
            </Button>
          }
        />
      );
    }
    return this.props.children;
  }
}

/** One failing region (a panel, a table) never takes the whole page down with it. */
export function RegionErrorBoundary({ region, children }: RegionErrorBoundaryProps) {
  return (
    <QueryErrorResetBoundary>
      {({ reset }) => (
        <Boundary region={region} onReset={reset}>
          {children}
        </Boundary>
      )}
    </QueryErrorResetBoundary>
  );
}
