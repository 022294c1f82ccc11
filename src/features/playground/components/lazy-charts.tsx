/**
 * Charts load on demand: recharts and the chart modules are fetched the first time a result with a
 * chart is shown, not with the console.
 */
import { Component, lazy, Suspense, type ComponentType, type ReactNode } from 'react';
import { LoadingState } from '../../../components/ui/feedback.tsx';

class ChartBoundary extends Component<{ children: ReactNode }, { failed: boolean }> {
  override state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  override render() {
    if (this.state.failed) return <p className="text-sm text-danger">The chart could not be loaded. The figures above are complete; reload the page to try again.</p>;
    return this.props.children;
  }
}

function onDemand<P extends object>(load: () => Promise<{ default: ComponentType<P> }>) {
  const Lazy = lazy(load);
  return function Chart(props: P) {
    return (
      <ChartBoundary>
        <Suspense fallback={<LoadingState label="Loading the chart…" />}>
          <Lazy {...props} />
        </Suspense>
      </ChartBoundary>
    );
  };
}

export const ChargeProfileChart = onDemand(() => import('../charts/charge-profile-chart.tsx'));
export const ConnectionChart = onDemand(() => import('../charts/connection-chart.tsx'));
export const LoadShareChart = onDemand(() => import('../charts/load-share-chart.tsx'));
export const WireCandidatesChart = onDemand(() => import('../charts/wire-candidates-chart.tsx'));
export const CapacityCurveChart = onDemand(() => import('../charts/capacity-curve-chart.tsx'));
