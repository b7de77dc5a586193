import { useParams } from 'react-router-dom';
import { BuildPage } from '../../features/builds/components/build-page';

export function BuildRoute() {
  const raw = useParams().id;
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) return <p role="alert" className="text-fail">“{raw}” is not a build number.</p>;
  return <BuildPage key={id} id={id} />;
}
