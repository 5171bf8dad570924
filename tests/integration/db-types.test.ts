// db/types.ts is written by hand beside the migrations. This test reads the migrated schema
// (information_schema and the check constraints of a clone of the test template database) and
// the types as the TypeScript compiler sees them through Kysely's Selectable and Insertable,
// and compares the two column by column, so that they cannot drift apart.
import path from "node:path";
import { sql } from "kysely";
import ts from "typescript";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase } from "../support/db";

/** What both sides say about one column. */
interface ColumnFacts {
  /** "string", "number", "boolean", "Date", "unknown" (JSON), or the allowed values "'a' | 'b'". */
  type: string;
  nullable: boolean;
  /** May an INSERT leave it out (a default, a sequence, or NULL)? */
  insertOptional: boolean;
}
type Schema = Record<string, Record<string, ColumnFacts>>;

const ROOT = path.resolve(import.meta.dirname, "../..");
const MIGRATION_TABLES = new Set(["kysely_migration", "kysely_migration_lock"]);

// PostgreSQL types as node-postgres hands them to the app. bigint is a number because the app
// installs a parser for it (app/.server/platform/db.server.ts); numeric would be a string.
const PG_TO_TS: Record<string, string> = {
  uuid: "string", text: "string", citext: "string", varchar: "string", bpchar: "string", numeric: "string",
  int2: "number", int4: "number", int8: "number", float4: "number", float8: "number",
  bool: "boolean", timestamptz: "Date", timestamp: "Date", date: "Date", json: "unknown", jsonb: "unknown",
};

const literalSet = (values: string[]) => [...values].sort().map((v) => `'${v}'`).join(" | ");

async function schemaFromDatabase(db: Awaited<ReturnType<typeof createTestDatabase>>["db"]): Promise<Schema> {
  const columns = await sql<{ table_name: string; column_name: string; udt_name: string; is_nullable: string; column_default: string | null; is_identity: string; is_generated: string }>`
    SELECT c.table_name, c.column_name, c.udt_name, c.is_nullable, c.column_default, c.is_identity, c.is_generated
    FROM information_schema.columns c
    JOIN information_schema.tables t ON t.table_schema = c.table_schema AND t.table_name = c.table_name
    WHERE c.table_schema = 'public' AND t.table_type = 'BASE TABLE'`.execute(db);
  // Single-column checks of the form `col IN ('a', 'b')`, which PostgreSQL keeps as `= ANY (ARRAY[…])`.
  const checks = await sql<{ table_name: string; definition: string }>`
    SELECT conrelid::regclass::text AS table_name, pg_get_constraintdef(oid) AS definition
    FROM pg_constraint WHERE contype = 'c' AND connamespace = 'public'::regnamespace`.execute(db);
  const allowed = new Map<string, string>();
  for (const c of checks.rows) {
    const m = /^CHECK \(\((\w+) = ANY \(ARRAY\[(.*)\]\)\)\)$/.exec(c.definition);
    if (m) allowed.set(`${c.table_name}.${m[1]}`, literalSet([...m[2].matchAll(/'((?:[^']|'')*)'::\w+/g)].map((v) => v[1])));
  }
  const schema: Schema = {};
  for (const c of columns.rows) {
    if (MIGRATION_TABLES.has(c.table_name)) continue;
    const type = allowed.get(`${c.table_name}.${c.column_name}`) ?? PG_TO_TS[c.udt_name] ?? `unmapped PostgreSQL type ${c.udt_name}`;
    const nullable = c.is_nullable === "YES";
    const defaulted = c.column_default !== null || c.is_identity === "YES" || c.is_generated === "ALWAYS";
    (schema[c.table_name] ??= {})[c.column_name] = { type, nullable, insertOptional: nullable || defaulted };
  }
  return schema;
}

function schemaFromTypes(): Schema {
  const parsed = ts.getParsedCommandLineOfConfigFile(path.join(ROOT, "tsconfig.json"), {}, { ...ts.sys, onUnRecoverableConfigFileDiagnostic: () => {} });
  if (!parsed) throw new Error("tsconfig.json could not be read");
  // A probe module beside db/types.ts, so that "kysely" resolves from the project's node_modules.
  const probe = path.join(ROOT, "db", "__db-types-probe__.ts");
  const probeText = `import type { Insertable, Selectable } from "kysely";
import type { Database } from "./types";
export type Select = { [T in keyof Database]: Selectable<Database[T]> };
export type Insert = { [T in keyof Database]: Insertable<Database[T]> };
`;
  const host = ts.createCompilerHost(parsed.options);
  const getSourceFile = host.getSourceFile.bind(host);
  const fileExists = host.fileExists.bind(host);
  const readFile = host.readFile.bind(host);
  host.getSourceFile = (name, language, ...rest) => (path.resolve(name) === probe ? ts.createSourceFile(name, probeText, language) : getSourceFile(name, language, ...rest));
  host.fileExists = (name) => path.resolve(name) === probe || fileExists(name);
  host.readFile = (name) => (path.resolve(name) === probe ? probeText : readFile(name));
  const program = ts.createProgram([probe], { ...parsed.options, noEmit: true }, host);
  const errors = ts.getPreEmitDiagnostics(program, program.getSourceFile(probe)).map((d) => ts.flattenDiagnosticMessageText(d.messageText, "\n"));
  if (errors.length) throw new Error(`db/types.ts does not compile:\n${errors.join("\n")}`);
  const checker = program.getTypeChecker();
  const exported = checker.getExportsOfModule(checker.getSymbolAtLocation(program.getSourceFile(probe)!)!);
  const typeNamed = (name: string) => checker.getDeclaredTypeOfSymbol(exported.find((s) => s.name === name)!);

  const members = (t: ts.Type) => (t.isUnion() ? t.types : [t]);
  const hasNull = (t: ts.Type) => members(t).some((m) => m.flags & ts.TypeFlags.Null);
  function describeSelect(t: ts.Type): string {
    const rest = members(t).filter((m) => !(m.flags & (ts.TypeFlags.Null | ts.TypeFlags.Undefined)));
    if (rest.length > 0 && rest.every((m) => m.isStringLiteral())) return literalSet(rest.map((m) => (m as ts.StringLiteralType).value));
    if (rest.length > 0 && rest.every((m) => m.flags & ts.TypeFlags.BooleanLiteral)) return "boolean";
    if (rest.length === 1) {
      const [m] = rest;
      if (m.flags & ts.TypeFlags.String) return "string";
      if (m.flags & ts.TypeFlags.Number) return "number";
      if (m.flags & ts.TypeFlags.Unknown) return "unknown";
      if (m.getSymbol()?.name === "Date") return "Date";
    }
    return `unexpected TypeScript type ${checker.typeToString(t)}`;
  }

  const select = typeNamed("Select");
  const insert = typeNamed("Insert");
  const schema: Schema = {};
  for (const table of checker.getPropertiesOfType(select)) {
    const selectRow = checker.getTypeOfSymbol(table);
    const insertRow = checker.getTypeOfSymbol(checker.getPropertyOfType(insert, table.name)!);
    schema[table.name] = {};
    for (const column of checker.getPropertiesOfType(selectRow)) {
      const selected = checker.getTypeOfSymbol(column);
      const inserted = checker.getPropertyOfType(insertRow, column.name);
      const insertType = inserted ? checker.getTypeOfSymbol(inserted) : undefined;
      schema[table.name][column.name] = {
        type: describeSelect(selected),
        // A JSON column selects as unknown, which swallows null: its insert type tells.
        nullable: hasNull(selected) || (insertType !== undefined && hasNull(insertType)),
        insertOptional: inserted === undefined || (inserted.flags & ts.SymbolFlags.Optional) !== 0,
      };
    }
  }
  return schema;
}

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let fromDatabase: Schema;
let fromTypes: Schema;

beforeAll(async () => {
  t = await createTestDatabase();
  fromDatabase = await schemaFromDatabase(t.db);
  fromTypes = schemaFromTypes();
}, 120_000);
afterAll(() => t?.drop());

describe("db/types.ts against the migrated schema", () => {
  it("has one interface per table, and no table the migrations do not create", () => {
    expect(Object.keys(fromTypes).sort()).toEqual(Object.keys(fromDatabase).sort());
  });

  it("has, for every table, the same columns with the same type, nullability and insert default", () => {
    // The figure table of the newest migration (2026_12_02_0900_create_figures) is among them.
    expect(fromDatabase).toHaveProperty("figure.draft_revision");
    expect(fromTypes).toEqual(fromDatabase);
  });

  it("gives enumerated text columns exactly the values their check constraints allow", () => {
    // The member roles come from app/permissions.ts; the database has its own list.
    expect(fromDatabase.membership.role.type).toBe("'coauthor' | 'contributor' | 'corresponding' | 'observer'");
    expect(fromTypes.membership.role.type).toBe(fromDatabase.membership.role.type);
    expect(fromTypes.invitation.role.type).toBe(fromDatabase.invitation.role.type);
    expect(fromTypes.app_user.site_role.type).toBe("'admin' | 'member'");
  });
});
