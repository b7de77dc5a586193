import { BuildsPage } from '../../features/builds/components/builds-page';

export function BuildsRoute() {
  return <BuildsPage />;
}
