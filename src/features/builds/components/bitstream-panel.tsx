import { useState, type DragEvent } from 'react';
import { Link } from 'react-router-dom';
import { fieldError, panel, panelTitle } from '../../../components/ui';
import type { BuildDetail, BuildRef } from '../../../lib/resources/build-detail';
import { useUploadBitstream } from '../api/upload-bitstream';
import { formatBytes } from './build-format';

function DuplicateWarning({ duplicates }: { duplicates: BuildRef[] }) {
  if (duplicates.length === 0) return null;
  return (
    <div role="alert" data-testid="duplicate-warning" className="rounded border border-signal bg-signal-soft p-2 text-sm">
      <strong>Same bitstream as {duplicates.length === 1 ? 'another build' : `${duplicates.length} other builds`}:</strong>{' '}
      {duplicates.map((d, i) => (
        <span key={d.id}>
          {i > 0 && ', '}
          <Link to={`/builds/${d.id}`} className="font-bold underline">
            {d.label}
          </Link>
        </span>
      ))}
      . Check that the right file was chosen: the SHA-256 is identical.
    </div>
  );
}

/** The build's bitstream: what is stored, a download link and, for engineers, an upload. */
export function BitstreamPanel({ build, canUpload }: { build: BuildDetail; canUpload: boolean }) {
  const upload = useUploadBitstream();
  const [progress, setProgress] = useState<number | null>(null);
  const [dragging, setDragging] = useState(false);

  const send = (file: File | undefined) => {
    if (!file) return;
    setProgress(0);
    upload.mutate({ buildId: build.id, file, onProgress: setProgress }, { onSettled: () => setProgress(null) });
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    send(e.dataTransfer.files[0]);
  };
  const duplicates = upload.data?.duplicates ?? build.duplicates;

  return (
    <section aria-labelledby="bitstream-title" className={panel}>
      <h2 id="bitstream-title" className={panelTitle}>
        Bitstream
      </h2>
      {build.fileName && build.sha256 && build.fileSize !== null ? (
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">File</dt>
          <dd className="break-all" data-testid="bitstream-name">{build.fileName}</dd>
          <dt className="text-ink-soft">Size</dt>
          <dd data-testid="bitstream-size">
            {formatBytes(build.fileSize)} ({build.fileSize.toLocaleString('en-US')} bytes)
          </dd>
          <dt className="text-ink-soft">SHA-256</dt>
          <dd className="break-all font-mono text-xs" data-testid="bitstream-sha256">
            {build.sha256}
          </dd>
          <dd className="col-span-2 mt-1">
            <a href={`/api/builds/${build.id}/file`} download className="font-bold underline">
              Download the bitstream
            </a>
          </dd>
        </dl>
      ) : (
        <p className="text-sm text-ink-soft">No bitstream uploaded yet.</p>
      )}
      <div className="mt-3 grid gap-2">
        <DuplicateWarning duplicates={duplicates} />
        {canUpload && (
          <div
            onDragOver={(e) => {
              e.preventDefault();
              setDragging(true);
            }}
            onDragLeave={() => setDragging(false)}
            onDrop={onDrop}
            data-testid="bitstream-drop"
            className={`grid gap-2 rounded border-2 border-dashed p-3 text-sm ${dragging ? 'border-signal bg-signal-soft' : 'border-rule'}`}
          >
            <p>{build.fileName ? 'Replace the bitstream: drop a file here, or' : 'Drop the bitstream file here, or'}</p>
            <input type="file" aria-label="Bitstream file" className="text-sm" disabled={upload.isPending} onChange={(e) => send(e.target.files?.[0])} />
            {progress !== null && (
              <div className="grid gap-1">
                <progress max={1} value={progress} aria-label="Upload progress" className="w-full" />
                <span className="text-xs text-ink-soft">{Math.round(progress * 100)} % sent</span>
              </div>
            )}
            {upload.isSuccess && (
              <p role="status" className="text-pass">
                Uploaded {upload.data.build.fileName}: {formatBytes(upload.data.build.fileSize ?? 0)}, SHA-256 computed by the server.
              </p>
            )}
            {upload.isError && (
              <p role="alert" className={fieldError}>
                The upload failed: {upload.error.message}
              </p>
            )}
          </div>
        )}
      </div>
    </section>
  );
}
