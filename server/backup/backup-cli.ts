// `npm run backup -- --out FILE`: a consistent copy of the database named by DATABASE_URL and of
// the bitstreams in UPLOAD_DIR, in one tar file, taken while the server runs.
import { parseArgs } from 'node:util';
import { ConfigError, loadConfig } from '../config';
import { BackupError, makeBackup } from './backup';
import { ToolMissing } from './pg-tools';

try {
  const { values } = parseArgs({ options: { out: { type: 'string' } }, strict: true });
  if (!values.out) throw new BackupError('usage: npm run backup -- --out FILE');
  const config = loadConfig();
  console.log(`Backing up to ${values.out}…`);
  const manifest = await makeBackup({ databaseUrl: config.databaseUrl, uploadDir: config.uploadDir, out: values.out });
  console.log(`Backed up the ${manifest.dialect} database and ${manifest.uploads.length} bitstream(s) to ${values.out}`);
} catch (err) {
  const known = err instanceof BackupError || err instanceof ToolMissing || err instanceof ConfigError || (err as { code?: string }).code?.startsWith('ERR_PARSE_ARGS');
  console.error(`Backup failed: ${known ? (err as Error).message : (err as Error).stack}`);
  process.exit(1);
}
