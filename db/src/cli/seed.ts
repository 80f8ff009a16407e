// `npm run db:seed`: seeds the demo scenario into DATABASE_URL once (idempotent).
import { seedDemo } from '../../seeders/demo.ts';
import { createDatabase } from '../index.ts';

const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set (npm start sets it; see README "Configuration").');
  process.exit(2);
}
const sequelize = createDatabase(url);
const created = await seedDemo(sequelize);
console.log(created ? '[db] demo scenario seeded' : '[db] demo scenario already present');
await sequelize.close();
