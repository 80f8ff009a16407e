// Runs once before the API tests: the database named by DATABASE_URL (npm test makes a fresh
// one) gets every migration. Tests create their own channels and users; nothing is shared.
import { createDatabase, migrateUp } from '@midgray/db';

export default async function setup() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the tests with `npm test`, which starts the test PostgreSQL');
  const sequelize = createDatabase(url);
  await migrateUp(sequelize);
  await sequelize.close();
}
