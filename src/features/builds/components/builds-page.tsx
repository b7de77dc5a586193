import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { btnPrimary, input, label } from '../../../components/ui';
import { useMe } from '../../auth/api/get-me';
import { useBuildList } from '../../../lib/resources/builds';
import { useCores } from '../../../lib/resources/cores';
import { BuildsTable } from './builds-table';
import { NewBuildForm } from './new-build-form';

/** /builds: every bitstream with its status; the core filter lives in the address (?core=id). */
export function BuildsPage() {
  const role = useMe().data?.role;
  const canCreate = role === 'engineer' || role === 'admin';
  const [params, setParams] = useSearchParams();
  const coreParam = Number(params.get('core'));
  const coreId = Number.isInteger(coreParam) && coreParam > 0 ? coreParam : null;
  const cores = useCores();
  const builds = useBuildList(coreId);
  const [creating, setCreating] = useState(false);

  const chooseCore = (value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set('core', value);
    else next.delete('core');
    setParams(next, { replace: true });
  };

  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-end gap-4">
        <h1 className="text-3xl font-bold mr-auto">Builds</h1>
        <label className={`${label} w-72`}>
          Core
          <select className={input} value={coreId ?? ''} onChange={(e) => chooseCore(e.target.value)}>
            <option value="">Every core</option>
            {cores.data?.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} ({c.slug})
              </option>
            ))}
          </select>
        </label>
        {canCreate && !creating && (
          <button type="button" className={btnPrimary} onClick={() => setCreating(true)}>
            New build
          </button>
        )}
      </div>
      {canCreate && creating && <NewBuildForm coreId={coreId} onCancel={() => setCreating(false)} />}
      {builds.isPending && <p className="text-ink-soft">Loading builds…</p>}
      {builds.isError && (
        <p role="alert" className="text-fail">
          The builds could not be loaded: {builds.error.message}
        </p>
      )}
      {builds.data && builds.data.length === 0 && <p className="text-ink-soft">{coreId === null ? 'No builds yet.' : 'This core has no builds yet.'}</p>}
      {builds.data && builds.data.length > 0 && <BuildsTable builds={builds.data} />}
    </div>
  );
}
