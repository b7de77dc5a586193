import { Link } from 'react-router-dom';
import type { SessionRecord } from '../../../lib/resources/sessions';

export const dateTime = (iso: string | null | undefined) => (iso ? new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'medium' }) : '—');
/** Shorter, for table rows. */
export const shortDateTime = (iso: string) => new Date(iso).toLocaleString('en-GB', { day: '2-digit', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

/** Core, build, board, operator and times of a session; `links` off for the printed report. */
export function SessionFacts({ session, links = true, buildExtra }: { session: SessionRecord; links?: boolean; buildExtra?: React.ReactNode }) {
  const core = session.core?.name ?? `core #${session.coreId}`;
  const build = session.build ? session.build.label : session.buildId ? `build #${session.buildId}` : null;
  const board = session.board ? session.board.name : session.boardId ? `board #${session.boardId}` : null;
  const link = (to: string, text: string) => (links ? <Link className="underline" to={to}>{text}</Link> : text);
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr_auto_1fr]">
      <dt className="text-ink-soft">Core</dt>
      <dd>{links ? <Link className="underline" to={`/cores/${session.coreId}`}>{core}</Link> : core}</dd>
      <dt className="text-ink-soft">Build</dt>
      <dd>
        {build && session.buildId ? link(`/builds/${session.buildId}`, build) : <span className="text-ink-soft">not recorded</span>}
        {buildExtra}
      </dd>
      <dt className="text-ink-soft">Board</dt>
      <dd>{board && session.boardId ? link(`/boards/${session.boardId}`, board) : <span className="text-ink-soft">not recorded</span>}</dd>
      <dt className="text-ink-soft">Operator</dt>
      <dd>{session.operator?.name ?? <span className="text-ink-soft">unknown</span>}</dd>
      <dt className="text-ink-soft">Started</dt>
      <dd className="font-mono">{dateTime(session.startedAt)}</dd>
      <dt className="text-ink-soft">Ended</dt>
      <dd className="font-mono">{dateTime(session.endedAt)}</dd>
      <dt className="text-ink-soft">Samples</dt>
      <dd className="font-mono">{session.sampleCount.toLocaleString('en-US')}</dd>
    </dl>
  );
}
