/**
 * Imported first by web/main.tsx: starts opening the database as soon as the app's script runs, before the
 * screens' modules are evaluated, so that the cold open overlaps everything else at start. The failure, if
 * any, is reported by the bootstrap's own `getDb()` (the same promise).
 */
import { getDb } from './db.ts';

void getDb().catch(() => undefined);
