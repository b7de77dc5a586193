import { ConditionGridPage } from '../../features/conditions/components/condition-grid-page';

export function ConditionGridRoute() {
  return <ConditionGridPage />;
}
