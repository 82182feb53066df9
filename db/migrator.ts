// The umzug migrator over db/migrations, shared by the CLI and the migration tests.
import path from "node:path";
import type { QueryInterface, Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";

export function migrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: {
      glob: ["migrations/*.ts", { cwd: path.join(import.meta.dirname ?? __dirname) }],
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () => (await import(file!)).up({ name, path: file, context }),
        down: async () => (await import(file!)).down({ name, path: file, context }),
      }),
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: undefined,
  });
}
