// npm run backup [-- --out <folder>] [--folder]   (a .tar archive in BACKUP_DIR by default)
// npm run restore -- <backup folder or .tar> [--force]
// Both read the same environment as the server (DATABASE_PATH, UPLOADS_DIR, STORAGE, S3_*).
import { parseArgs } from 'node:util';
import { createContext } from '../bootstrap';
import { readEnv } from '../env';
import { createBackup } from './backup';
import { restoreBackup } from './restore';

const [command, ...rest] = process.argv.slice(2);
const mb = (bytes: number) => `${(bytes / 1048576).toFixed(1)} MB`;

async function main(): Promise<void> {
  if (command === 'backup') {
    const { values } = parseArgs({ args: rest, options: { out: { type: 'string' }, folder: { type: 'boolean', default: false } } });
    const ctx = createContext({ LOG_LEVEL: 'warn' });
    try {
      const result = await createBackup(ctx, values.out ?? ctx.env.backupDir, { archive: !values.folder });
      const m = result.manifest;
      console.log(`Backup written: ${result.path} (${mb(result.bytes)})`);
      console.log(`  ${m.counts.projects} projects, ${m.counts.builds} builds, ${m.counts.curves} curves, ${m.raw.length} raw files; SHA-256 sums in SHA256SUMS`);
    } finally {
      ctx.db.$client.close();
    }
    return;
  }
  if (command === 'restore') {
    const { values, positionals } = parseArgs({ args: rest, allowPositionals: true, options: { force: { type: 'boolean', default: false } } });
    if (positionals.length !== 1) throw new Error('usage: npm run restore -- <backup folder or .tar> [--force]');
    const env = readEnv();
    const report = await restoreBackup(positionals[0]!, env, { force: values.force });
    const m = report.manifest;
    console.log(`Restored ${positionals[0]} (made ${m.createdAt}) into ${report.databasePath}`);
    console.log(`  ${m.counts.projects} projects, ${m.counts.builds} builds, ${m.counts.curves} curves; ${report.rawFiles} raw files checked and put in ${report.store}`);
    return;
  }
  throw new Error('usage: tsx server/backup/cli.ts backup|restore …');
}

main().then(
  () => process.exit(0),
  (error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  },
);
