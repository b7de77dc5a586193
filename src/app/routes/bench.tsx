import { BenchPage } from '../../features/bench/components/bench-page';

export function BenchRoute() {
  return <BenchPage />;
}
