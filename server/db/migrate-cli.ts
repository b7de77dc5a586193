// `npm run migrate [-- down]`: apply pending migrations (or undo the last one).
import { loadConfig } from '../config';
import { openDatabase } from './connection';
import { createMigrator } from './migrator';

const config = loadConfig();
const db = openDatabase(config.databaseUrl);
const migrator = createMigrator(db);
const done = process.argv[2] === 'down' ? await migrator.down() : await migrator.up();
console.log(done.length ? done.map((m) => `${process.argv[2] === 'down' ? 'reverted' : 'applied'} ${m.name}`).join('\n') : 'nothing to do');
await db.close();
