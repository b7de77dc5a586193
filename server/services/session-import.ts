// Reading an imported session file: a recorder archive (kept as the session's archive) or a CSV of
// angle_code,cos_code,sin_code; for a vectoring core, a CSV of x_code,y_code,angle_code,magnitude_code.
// Either becomes packed samples for storeSession, which scores them.
import { samplesFromArchive } from '../../shared/link-engine/archive-samples';
import { parseSampleCsv, SampleCsvError } from '../../shared/link-engine/sample-csv';
import { packColumns, type UnpackedSamples } from '../../shared/link-engine/sample-pack';
import { parseVectorCsv, VECTOR_CSV_HEADER } from '../../shared/link-engine/vector-sample-csv';
import { packVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import type { CoreMode } from '../../shared/link-engine/limits';
import { ARCHIVE_MAGIC, ArchiveError } from '../../shared/link';
import { HttpError } from '../http-error';

export interface ImportedFile {
  source: 'archive' | 'csv';
  samples: Buffer;
  archive: Buffer | null;
  deviceInfo: Record<string, unknown> | null;
  link: Record<string, unknown> | undefined;
}

const isArchive = (bytes: Uint8Array) => bytes.length >= ARCHIVE_MAGIC.length && ARCHIVE_MAGIC.every((b, i) => bytes[i] === b);

const packed = (s: UnpackedSamples) => Buffer.from(packColumns(s).buffer);

const csvError = (err: SampleCsvError) => new HttpError(400, 'bad_csv', `file: ${err.message}`, [{ path: 'file', line: err.line, message: err.message }]);

/** A vectoring core's import: CSV only (the recorder does not capture vectoring traffic yet). */
function readVectorImport(bytes: Buffer, fileName: string): ImportedFile {
  if (isArchive(bytes)) throw new HttpError(400, 'bad_import', `file: recorder archives of vectoring cores cannot be imported yet; import a CSV of ${VECTOR_CSV_HEADER}`);
  if (bytes.includes(0)) throw new HttpError(400, 'bad_import', `file: ${fileName || 'the file'} is not CSV text`);
  try {
    return { source: 'csv', samples: Buffer.from(packVectorSamples(parseVectorCsv(bytes.toString('utf8'))).buffer), archive: null, deviceInfo: null, link: undefined };
  } catch (err) {
    if (err instanceof SampleCsvError) throw csvError(err);
    throw err;
  }
}

/** @throws HttpError 400 saying what is wrong with the file (for a CSV, on which line). */
export function readImport(bytes: Buffer, fileName: string, mode: CoreMode = 'rotation'): ImportedFile {
  if (mode === 'vectoring') return readVectorImport(bytes, fileName);
  if (isArchive(bytes)) {
    let found;
    try {
      found = samplesFromArchive(bytes);
    } catch (err) {
      if (err instanceof ArchiveError) throw new HttpError(400, 'bad_archive', `file: not a readable recorder archive (${err.message})`);
      throw err;
    }
    if (found.codes.length === 0) throw new HttpError(400, 'bad_archive', 'file: the archive holds no answered requests');
    return {
      source: 'archive',
      samples: packed(found),
      archive: bytes,
      deviceInfo: found.info as Record<string, unknown> | null,
      link: { checkFailures: found.checkFailures, incompleteRequests: found.incompleteRequests },
    };
  }
  if (bytes.includes(0)) throw new HttpError(400, 'bad_import', `file: ${fileName || 'the file'} is neither a recorder archive nor CSV text`);
  try {
    return { source: 'csv', samples: packed(parseSampleCsv(bytes.toString('utf8'))), archive: null, deviceInfo: null, link: undefined };
  } catch (err) {
    if (err instanceof SampleCsvError) throw csvError(err);
    throw err;
  }
}
