// The version of the data: it moves with every write to the database, whatever code made it,
// so a costly read (the builds list) can be kept until the data changes. It is read from SQLite
// itself: total_changes() counts the rows this connection has inserted, updated or deleted, and
// data_version moves when another connection (another process) commits. No write has to
// remember to say it changed something.
import type { Db } from './index';

const statements = new WeakMap<object, { get(): unknown }>();

export function dataVersion(db: Db): string {
  let statement = statements.get(db.$client);
  if (!statement) {
    statement = db.$client.prepare('select total_changes() as own, (select data_version from pragma_data_version) as others');
    statements.set(db.$client, statement);
  }
  const { own, others } = statement.get() as { own: number; others: number };
  return `${own}.${others}`;
}
