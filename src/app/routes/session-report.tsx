import { useParams } from 'react-router-dom';
import { SessionReport } from '../../features/sessions/report/session-report';

export function SessionReportRoute() {
  const raw = useParams().id;
  const id = Number(raw);
  if (!Number.isInteger(id) || id < 1) return <p className="text-fail">“{raw}” is not a session number.</p>;
  return <SessionReport key={id} id={id} />;
}
