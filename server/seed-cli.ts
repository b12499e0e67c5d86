import { loadConfig } from './config';
import { openDatabase } from './db/client';
import { DataDirLockedError } from './db/lock';
import { clearDatabase, seedDemo } from './db/seed';

// `npm run seed`: wipe the configured database and load the demo scenario again.
// The server must be stopped first (the embedded database's lock refuses a second process).
const config = loadConfig();
try {
  const database = await openDatabase(config);
  try {
    await database.migrate();
    await clearDatabase(database.db);
    const r = await seedDemo(database.db);
    console.log(
      `Demo data loaded: team "${r.team.name}", ${r.users} users, ${r.spools} spools. Password: spoolwright-demo`,
    );
  } finally {
    await database.close();
  }
} catch (err) {
  console.error(
    err instanceof DataDirLockedError ? err.message : err instanceof Error ? err.message : err,
  );
  process.exit(1);
}
