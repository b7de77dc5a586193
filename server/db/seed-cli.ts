// `npm run seed`: migrate, then add the demo data unless the database already has users.
import { loadConfig } from '../config';
import { openDatabase } from './connection';
import { migrate } from './migrator';
import { seedIfEmpty } from './seed';

const config = loadConfig();
const db = openDatabase(config.databaseUrl);
await migrate(db);
console.log((await seedIfEmpty(db, config.demoPassword)) ? 'seeded the demo data' : 'the database already has users: nothing seeded');
await db.close();
