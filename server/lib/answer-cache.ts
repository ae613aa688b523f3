// A small cache of serialised answers, dropped oldest-first beyond `size` entries. Keys carry
// the data version (server/db/data-version.ts), so an entry is never read after a write.
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
