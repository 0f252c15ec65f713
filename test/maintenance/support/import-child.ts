/**
 * Child process of the crash-safety test: runs one historical import through the import service
 * on the given database and is killed (SIGKILL) by the parent while it writes.
 *
 *   node --import tsx test/maintenance/support/import-child.ts <database> <file.csv> <importer e-mail>
 *
 * Marks on stdout, written with writeSync so each is in the pipe before the next statement runs
 * (a SIGKILL loses nothing already written): `ready`, `begin` (the plan is checked; the write
 * transaction starts next, synchronously), `inside <fraction>` (every 1,000 rows, from inside the
 * transaction), `committed <counts>`. After committing it waits to be killed.
 */
import 'reflect-metadata';
import { readFileSync, writeSync } from 'node:fs';
import { openDatabase } from '../../../server/data-source';
import { ImportService } from '../../../server/import/import.service';
import { ScheduleService } from '../../../server/services/schedule.service';
import { storedUser } from './stored-user';

const [database, csvFile, importerEmail] = process.argv.slice(2);
const mark = (line: string): void => {
  writeSync(1, `${line}\n`);
};

const dataSource = await openDatabase({ database });
const imports = new ImportService(dataSource, new ScheduleService(dataSource));
const importer = await storedUser(dataSource, importerEmail);
const bytes = readFileSync(csvFile);
mark('ready');
let hasBegun = false;
const outcome = await imports.importFile(importer, bytes, (state, progress) => {
  if (state !== 'importing') return;
  if (!hasBegun) {
    hasBegun = true;
    mark('begin');
  } else {
    mark(`inside ${progress.toFixed(3)}`);
  }
});
mark(`${outcome.state === 'done' ? 'committed' : outcome.state} ${JSON.stringify(outcome.counts)} ${JSON.stringify(outcome.issues.slice(0, 3))}`);
setInterval(() => undefined, 60_000);
