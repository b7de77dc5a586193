// `npm run restore -- FILE`: a backup made by `npm run backup` into the empty database named by
// DATABASE_URL and the empty upload folder UPLOAD_DIR; refuses either when it holds anything.
import { parseArgs } from 'node:util';
import { ConfigError, loadConfig } from '../config';
import { BackupError, restoreBackup } from './backup';
import { ToolMissing } from './pg-tools';
import { TarFormatError } from './tar';

try {
  const { positionals } = parseArgs({ allowPositionals: true, strict: true });
  if (positionals.length !== 1) throw new BackupError('usage: npm run restore -- FILE');
  const config = loadConfig();
  const manifest = await restoreBackup({ databaseUrl: config.databaseUrl, uploadDir: config.uploadDir, file: positionals[0] });
  console.log(`Restored the ${manifest.dialect} database of ${manifest.createdAt} and ${manifest.uploads.length} bitstream(s); start the server to use them.`);
} catch (err) {
  const known = err instanceof BackupError || err instanceof ToolMissing || err instanceof TarFormatError || err instanceof ConfigError || (err as { code?: string }).code?.startsWith('ERR_PARSE_ARGS');
  console.error(`Restore failed: ${known ? (err as Error).message : (err as Error).stack}`);
  process.exit(1);
}
