import { useMe } from '../../features/auth/api/get-me';
import { CoresPage } from '../../features/cores/components/cores-page';

export function CoresRoute() {
  const role = useMe().data?.role;
  return <CoresPage canEdit={role === 'engineer' || role === 'admin'} />;
}
