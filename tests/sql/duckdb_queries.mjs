// Runs SQL queries on DuckDB (its Node.js client, @duckdb/node-api, from this folder's locked
// package.json) for tests/cli/test_cli_sql_recipes.py: loads a CSV file of text columns into a
// table and writes each query's result as CSV with a header row, as `duckdb -csv` prints it.
// Usage: node duckdb_queries.mjs TABLE.csv TABLE_NAME QUERIES.json OUT_DIR
//   QUERIES.json: a list of SQL texts; the result of the i-th goes to OUT_DIR/i.csv.
import { DuckDBInstance } from '@duckdb/node-api';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const [csv, table, queriesFile, outDir] = process.argv.slice(2);
if (!outDir) {
    console.error('usage: node duckdb_queries.mjs TABLE.csv TABLE_NAME QUERIES.json OUT_DIR');
    process.exit(2);
}
const instance = await DuckDBInstance.create(':memory:');
const con = await instance.connect();
// Every column as text (all_varchar), so amounts keep their written form; an empty field is NULL.
const quoted = csv.replaceAll("'", "''");
await con.run(`create table ${table} as select * from read_csv('${quoted}', header = true, all_varchar = true)`);
const version = (await con.runAndReadAll('select version()')).getRows()[0][0];
const field = (v) => {
    const s = v === null ? '' : String(v);
    return /[",\n\r]/.test(s) ? '"' + s.replaceAll('"', '""') + '"' : s;
};
const queries = JSON.parse(readFileSync(queriesFile, 'utf8'));
for (let i = 0; i < queries.length; ++i) {
    const reader = await con.runAndReadAll(queries[i]);
    const lines = [reader.columnNames().map(field).join(',')];
    for (const row of reader.getRows()) lines.push(row.map(field).join(','));
    writeFileSync(join(outDir, `${i}.csv`), lines.join('\n') + '\n');
}
console.log(`duckdb ${version}: ${queries.length} queries`);
