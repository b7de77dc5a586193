import { useState } from 'react';
import { btnPrimary, fieldError } from '../../../components/ui';
import { useCores } from '../../../lib/resources/cores';
import { CoresTable } from './cores-table';
import { NewCoreForm } from './new-core-form';

/** /cores: the list, and for engineers (`canEdit`) a form for a new core. */
export function CoresPage({ canEdit }: { canEdit: boolean }) {
  const cores = useCores();
  const [adding, setAdding] = useState(false);
  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">Cores</h1>
          <p className="text-sm text-ink-soft">Each core’s link, the reference model its answers are checked against, and the limits a session must meet.</p>
        </div>
        {canEdit && !adding && (
          <button type="button" className={btnPrimary} onClick={() => setAdding(true)}>
            New core
          </button>
        )}
      </div>
      {adding && canEdit && <NewCoreForm onCancel={() => setAdding(false)} />}
      {cores.isPending && <p className="text-ink-soft">Loading cores…</p>}
      {cores.isError && <p role="alert" className={fieldError}>The cores could not be loaded: {cores.error.message}</p>}
      {cores.data && cores.data.length === 0 && <p className="text-ink-soft">No cores yet.{canEdit ? ' Add the first with “New core”.' : ''}</p>}
      {cores.data && cores.data.length > 0 && <CoresTable cores={cores.data} />}
    </div>
  );
}
