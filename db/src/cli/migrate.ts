// `npm run db:migrate`: applies pending migrations to DATABASE_URL.
import { createDatabase, migrateUp } from '../index.ts';

const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set (npm start sets it; see README "Configuration").');
  process.exit(2);
}
const sequelize = createDatabase(url);
const applied = await migrateUp(sequelize);
console.log(applied.length ? `[db] applied ${applied.length} migration(s): ${applied.join(', ')}` : '[db] schema up to date');
await sequelize.close();
