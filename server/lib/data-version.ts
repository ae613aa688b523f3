// A counter per project that moves on every audited write (every write is audited), so a read
// that is costly to rebuild — the builds list — can be cached until the project changes.
// Writes without a project (labs, people) move the global counter, which invalidates all.
// One process owns the SQLite database, so an in-memory counter is exact; several app
// processes would need the counter in the database (see README, "Beyond one machine").
const perProject = new Map<number, number>();
let global = 0;

export function bumpDataVersion(projectId: number | null | undefined): void {
  if (projectId == null) global += 1;
  else perProject.set(projectId, (perProject.get(projectId) ?? 0) + 1);
}

export function dataVersion(projectId: number): string {
  return `${global}.${perProject.get(projectId) ?? 0}`;
}

/** A small cache of serialised answers, dropped oldest-first beyond `size` entries. */
export function answerCache(size: number) {
  const entries = new Map<string, string>();
  return {
    get(key: string): string | undefined {
      return entries.get(key);
    },
    set(key: string, value: string): void {
      if (entries.size >= size) entries.delete(entries.keys().next().value!);
      entries.set(key, value);
    },
  };
}
