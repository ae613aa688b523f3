// `npm run seed`: seed the demo lab into DATABASE_PATH if it has no people yet.
import { createContext } from '../bootstrap';
import { seedIfEmpty } from './seed';

const ctx = createContext();
const seeded = await seedIfEmpty(ctx);
console.log(seeded ? `Demo lab seeded into ${ctx.env.databasePath}` : `${ctx.env.databasePath} already has people; nothing seeded`);
ctx.db.$client.close();
