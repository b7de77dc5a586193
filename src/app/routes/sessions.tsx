import { SessionsPage } from '../../features/sessions/list/sessions-page';

export function SessionsRoute() {
  return <SessionsPage />;
}
