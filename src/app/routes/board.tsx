import { useParams } from 'react-router-dom';
import { useMe } from '../../features/auth/api/get-me';
import { BoardPage } from '../../features/boards/components/board-page';

export function BoardRoute() {
  const id = Number(useParams().id);
  const role = useMe().data?.role;
  if (!Number.isInteger(id) || id <= 0) return <p className="text-ink-soft">That is not a board address.</p>;
  return <BoardPage key={id} id={id} canEdit={role === 'engineer' || role === 'admin'} />;
}
