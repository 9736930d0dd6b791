import { DuckDBInstance } from '@duckdb/node-api';
import pg from 'pg';
import { startCluster, type PostgresCluster } from './postgresCluster';

/** A column of a test table: its SQL type and its values (null is NULL). */
export interface TestColumn {
  readonly name: string;
  readonly type: 'DOUBLE PRECISION' | 'INTEGER' | 'VARCHAR' | 'BOOLEAN';
  readonly values: ReadonlyArray<number | string | boolean | null>;
}

/** One real SQL engine for the push-down tests: make a table, run a query, read its one row. */
export interface SqlEngine {
  readonly name: string;
  run(sql: string): Promise<void>;
  /** Runs a query and returns its first row with lower-cased keys (numbers as JS numbers where exact). */
  row(sql: string): Promise<Record<string, unknown>>;
  /** Runs a query and returns every row (keys lower-cased, as `row`). */
  rows(sql: string): Promise<Array<Record<string, unknown>>>;
  /** Creates (or replaces) a table, under a schema when the name has one ("research.visits"). */
  table(parts: readonly string[], columns: readonly TestColumn[]): Promise<void>;
  close(): Promise<void>;
}

const quote = (name: string) => `"${name.replace(/"/g, '""')}"`;
const literal = (value: number | string | boolean | null) =>
  value === null ? 'NULL' : typeof value === 'number' ? (Number.isFinite(value) ? value.toPrecision(17) : `'NaN'`) : typeof value === 'boolean' ? String(value) : `'${value.replace(/'/g, "''")}'`;

async function createTable(engine: Pick<SqlEngine, 'run'>, parts: readonly string[], columns: readonly TestColumn[]): Promise<void> {
  if (parts.length > 1) await engine.run(`CREATE SCHEMA IF NOT EXISTS ${quote(parts[0])}`);
  const name = parts.map(quote).join('.');
  await engine.run(`DROP TABLE IF EXISTS ${name}`);
  await engine.run(`CREATE TABLE ${name} (${columns.map((c) => `${quote(c.name)} ${c.type}`).join(', ')})`);
  const n = columns[0]?.values.length ?? 0;
  for (let start = 0; start < n; start += 500) {
    const rows: string[] = [];
    for (let i = start; i < Math.min(n, start + 500); i++) rows.push(`(${columns.map((c) => (c.type === 'DOUBLE PRECISION' && typeof c.values[i] === 'number' ? `CAST(${literal(c.values[i])} AS DOUBLE PRECISION)` : literal(c.values[i]))).join(', ')})`);
    if (rows.length) await engine.run(`INSERT INTO ${name} VALUES ${rows.join(', ')}`);
  }
}

function plainRow(row: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(row).map(([k, v]) => [k.toLowerCase(), typeof v === 'bigint' ? Number(v) : v]));
}

/** DuckDB, embedded, in memory. */
export async function duckDbEngine(): Promise<SqlEngine> {
  const instance = await DuckDBInstance.create(':memory:');
  const connection = await instance.connect();
  const engine: SqlEngine = {
    name: 'DuckDB',
    run: async (sql) => void (await connection.run(sql)),
    async row(sql) {
      const reader = await connection.runAndReadAll(sql);
      return plainRow(reader.getRowObjectsJS()[0] as Record<string, unknown>);
    },
    async rows(sql) {
      const reader = await connection.runAndReadAll(sql);
      return reader.getRowObjectsJS().map((r) => plainRow(r as Record<string, unknown>));
    },
    table: (parts, columns) => createTable(engine, parts, columns),
    async close() {
      connection.closeSync();
    },
  };
  return engine;
}

/** PostgreSQL: a real server in a throw-away cluster on 127.0.0.1, through node-postgres. */
export async function postgresEngine(): Promise<SqlEngine> {
  const cluster: PostgresCluster = await startCluster();
  const client = new pg.Client({ host: cluster.host, port: cluster.port, user: cluster.user, database: cluster.database });
  // NUMERIC and BIGINT arrive as text from node-postgres; read them as numbers (the tests compare numbers).
  client.setTypeParser(20, (v: string) => Number(v));
  client.setTypeParser(1700, (v: string) => Number(v));
  await client.connect();
  const engine: SqlEngine = {
    name: 'PostgreSQL',
    run: async (sql) => void (await client.query(sql)),
    async row(sql) {
      const result = await client.query(sql);
      const rows = Array.isArray(result) ? result[result.length - 1].rows : result.rows;
      return plainRow(rows[0] as Record<string, unknown>);
    },
    async rows(sql) {
      const result = await client.query(sql);
      const last = Array.isArray(result) ? result[result.length - 1] : result;
      return last.rows.map((r: Record<string, unknown>) => plainRow(r));
    },
    table: (parts, columns) => createTable(engine, parts, columns),
    async close() {
      await client.end();
      cluster.stop();
    },
  };
  return engine;
}
