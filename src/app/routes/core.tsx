import { useParams } from 'react-router-dom';
import { useMe } from '../../features/auth/api/get-me';
import { CorePage } from '../../features/cores/components/core-page';

export function CoreRoute() {
  const id = Number(useParams().id);
  const role = useMe().data?.role;
  if (!Number.isInteger(id) || id <= 0) return <p className="text-ink-soft">That is not a core address.</p>;
  // key: another core is another form
  return <CorePage key={id} id={id} canEdit={role === 'engineer' || role === 'admin'} />;
}
