import { useParams } from 'react-router-dom';
import { SessionPage } from '../../features/sessions/detail/session-page';

export function SessionRoute() {
  const raw = useParams().id;
  const id = Number(raw);
  if (!Number.isInteger(id) || id < 1) return <p className="text-fail">“{raw}” is not a session number.</p>;
  return <SessionPage key={id} id={id} />;
}
