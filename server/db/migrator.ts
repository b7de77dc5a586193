import path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { projectRoot } from '../paths';

export interface MigrationContext {
  queryInterface: QueryInterface;
  sequelize: Sequelize;
}

/** A migration module: `server/db/migrations/NNNN-what-it-does.ts` exporting up and down. */
export interface MigrationModule {
  up(ctx: MigrationContext): Promise<void>;
  down(ctx: MigrationContext): Promise<void>;
}

/** The migrator over server/db/migrations, recording what ran in the SequelizeMeta table. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['server/db/migrations/*.ts', { cwd: projectRoot, ignore: ['**/*.d.ts'] }],
      resolve: ({ name, path: file, context }) => {
        const load = async () => (await import(pathToFileURL(path.resolve(projectRoot, file!)).href)) as MigrationModule;
        return {
          name: name.replace(/\.ts$/, ''),
          up: async () => (await load()).up(context),
          down: async () => (await load()).down(context),
        };
      },
    },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

/** Apply every pending migration; resolve to the number of migrations applied in all. */
export async function migrate(sequelize: Sequelize): Promise<number> {
  const migrator = createMigrator(sequelize);
  await migrator.up();
  return (await migrator.executed()).length;
}
