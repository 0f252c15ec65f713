/**
 * `tsx scripts/pg-admin.ts <postgres-url> <sql>`: runs one statement outside a transaction (as
 * CREATE/DROP DATABASE need) and prints the first column of each row, one per line. Used by
 * scripts/test-pg.sh, so the script needs no psql client.
 */
import pg from 'pg';

const [url, sql] = process.argv.slice(2);
if (!url || !sql) {
  console.error('Usage: tsx scripts/pg-admin.ts <postgres-url> <sql>');
  process.exit(2);
}
const client = new pg.Client({ connectionString: url });
await client.connect();
try {
  const result = await client.query<Record<string, unknown>>(sql);
  for (const row of result.rows) console.log(String(Object.values(row)[0]));
} finally {
  await client.end();
}
