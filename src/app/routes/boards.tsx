import { useMe } from '../../features/auth/api/get-me';
import { BoardsPage } from '../../features/boards/components/boards-page';

export function BoardsRoute() {
  const role = useMe().data?.role;
  return <BoardsPage canEdit={role === 'engineer' || role === 'admin'} />;
}
