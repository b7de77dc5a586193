import { ComparePage } from '../../features/compare/components/compare-page';

export function CompareRoute() {
  return <ComparePage />;
}
