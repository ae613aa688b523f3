// `npm run db:migrate`: apply the committed migrations to DATABASE_PATH and exit.
import { readEnv } from '../env';
import { openDatabase } from './index';

const env = readEnv();
const db = openDatabase(env.databasePath);
db.$client.close();
console.log(`Migrations applied to ${env.databasePath}`);
