// Exercises docker-free-db-scripts/*.sh end to end on a private cluster:
// its own free port and folders under <repo>/.tmp/, so the default cluster
// (port 54329, .data/postgres) that the test harness uses is never touched.
import { execFile } from "node:child_process";
import { chownSync, existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { createServer, connect, type Server } from "node:net";
import { networkInterfaces } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const scripts = join(repo, "docker-free-db-scripts");
const DEFAULT_PORT = 54329;
const DB = "rw_scripts_test";
const LONG = 60_000;

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

function run(script: string, args: string[], env: Record<string, string>): Promise<Run> {
  return new Promise((done) => {
    execFile("bash", [join(scripts, script), ...args], { env: { ...process.env, ...env } }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === "number" ? err.code : 1) : 0;
      done({ code, stdout, stderr });
    });
  });
}

// Ask the kernel for an unused port, never the default cluster's.
async function freePort(): Promise<number> {
  for (;;) {
    const port = await new Promise<number>((done, fail) => {
      const s = createServer();
      s.once("error", fail);
      s.listen(0, "127.0.0.1", () => {
        const addr = s.address();
        s.close(() => done(typeof addr === "object" && addr ? addr.port : 0));
      });
    });
    if (port !== DEFAULT_PORT && port > 0) return port;
  }
}

function canConnect(host: string, port: number): Promise<boolean> {
  return new Promise((done) => {
    const sock = connect({ host, port, timeout: 2000 });
    sock.once("connect", () => {
      sock.destroy();
      done(true);
    });
    sock.once("error", () => done(false));
    sock.once("timeout", () => {
      sock.destroy();
      done(false);
    });
  });
}

async function query(url: string, sql: string): Promise<Record<string, unknown>[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return (await client.query(sql)).rows;
  } finally {
    await client.end();
  }
}

// First non-loopback IPv4 address of this machine, if any.
function outsideAddress(): string | undefined {
  for (const list of Object.values(networkInterfaces())) {
    for (const a of list ?? []) if (a.family === "IPv4" && !a.internal) return a.address;
  }
  return undefined;
}

describe("docker-free-db-scripts", { timeout: LONG }, () => {
  let tmp = "";
  let port = 0;
  let env: Record<string, string> = {};
  let url = "";
  let ownerUrl = "";
  const urls = (db: string) =>
    `DATABASE_URL=postgres://ropewalk_app@127.0.0.1:${port}/${db}\nMIGRATION_DATABASE_URL=postgres://ropewalk_owner@127.0.0.1:${port}/${db}\n`;
  const heldServers: Server[] = [];

  beforeAll(async () => {
    mkdirSync(join(repo, ".tmp"), { recursive: true });
    tmp = mkdtempSync(join(repo, ".tmp", "db-scripts-"));
    port = await freePort();
    env = { PGPORT: String(port), RW_PGDATA: join(tmp, "data"), RW_PGRUN: join(tmp, "run") };
    url = `postgres://ropewalk_app@127.0.0.1:${port}/${DB}`;
    ownerUrl = `postgres://ropewalk_owner@127.0.0.1:${port}/${DB}`;
  });

  afterAll(async () => {
    for (const s of heldServers) s.close();
    if (tmp) {
      await run("stop.sh", [], env);
      rmSync(tmp, { recursive: true, force: true });
    }
  }, LONG);

  it("start from nothing creates the cluster and database, listening on loopback only", async () => {
    expect(existsSync(env.RW_PGDATA)).toBe(false);
    const r = await run("start.sh", [DB], env);
    expect(r.stderr).not.toBe(""); // progress goes to stderr...
    expect(r.code).toBe(0);
    expect(r.stdout).toBe(urls(DB)); // ...and only the URLs to stdout
    expect(existsSync(join(env.RW_PGDATA, ".ropewalk-cluster"))).toBe(true);

    const rows = await query(url, "select current_user as u, current_database() as d");
    expect(rows[0]).toEqual({ u: "ropewalk_app", d: DB });
    // The app role is no superuser and owns nothing; the owner role owns the database and may create others.
    const roles = await query(
      url,
      "select rolname, rolsuper, rolcreatedb, rolcreaterole from pg_roles where rolname like 'ropewalk_%' order by 1",
    );
    expect(roles).toEqual([
      { rolname: "ropewalk_app", rolsuper: false, rolcreatedb: false, rolcreaterole: false },
      { rolname: "ropewalk_owner", rolsuper: false, rolcreatedb: true, rolcreaterole: false },
    ]);
    expect(
      (await query(url, "select pg_get_userbyid(datdba) as o from pg_database where datname = current_database()"))[0],
    ).toEqual({ o: "ropewalk_owner" });
    // Server settings are read as the cluster's superuser (fresh clusters name it "postgres").
    const su = `postgres://postgres@127.0.0.1:${port}/${DB}`;
    expect((await query(su, "show listen_addresses"))[0].listen_addresses).toBe("127.0.0.1");
    expect((await query(su, "show unix_socket_directories"))[0].unix_socket_directories).toBe(env.RW_PGRUN);
    expect(readdirSync(env.RW_PGRUN)).toContain(`.s.PGSQL.${port}`);

    // Checked from outside the server too: nothing answers on a non-loopback address.
    const outside = outsideAddress();
    if (outside) expect(await canConnect(outside, port)).toBe(false);

    await query(ownerUrl, "create table kept (v int); insert into kept values (42)");
  });

  it("hands a database made before the roles existed (owned by the superuser) to the owner role", async () => {
    const su = `postgres://postgres@127.0.0.1:${port}`;
    await query(`${su}/postgres`, "create database rw_legacy");
    await query(
      `${su}/rw_legacy`,
      `create schema drizzle; create table drizzle.m (id serial primary key);
      create table t (id bigserial primary key, v int); create function f() returns int language sql as 'select 1'`,
    );
    const r = await run("start.sh", ["rw_legacy"], env);
    expect(r.code).toBe(0);
    const owners = await query(
      `${su}/rw_legacy`,
      `select c.relname as name, pg_get_userbyid(c.relowner) as owner from pg_class c
      join pg_namespace n on n.oid = c.relnamespace where n.nspname in ('public', 'drizzle') and c.relkind in ('r', 'S')
      union all select 'f', pg_get_userbyid(proowner) from pg_proc where proname = 'f'
      union all select 'drizzle', pg_get_userbyid(nspowner) from pg_namespace where nspname = 'drizzle'
      union all select 'db', pg_get_userbyid(datdba) from pg_database where datname = 'rw_legacy' order by 1`,
    );
    expect(
      owners.every((o) => o.owner === "ropewalk_owner"),
      JSON.stringify(owners),
    ).toBe(true);
    expect(owners.map((o) => o.name)).toEqual(["db", "drizzle", "f", "m", "m_id_seq", "t", "t_id_seq"]);
  });

  it("start again is idempotent: same output, same cluster and data", async () => {
    const r = await run("start.sh", [DB], env);
    expect(r.code).toBe(0);
    expect(r.stdout).toBe(urls(DB));
    expect(r.stderr).toMatch(/already running/);
    // A re-created cluster would have lost this row.
    expect((await query(ownerUrl, "select v from kept"))[0]).toEqual({ v: 42 });
  });

  it("start with no arguments creates the default database, with several one URL each", async () => {
    const r = await run("start.sh", [], env);
    expect(r.code).toBe(0);
    expect(r.stdout).toBe(urls("ropewalk"));
    const two = await run("start.sh", ["rw_a", "rw_b"], env);
    expect(two.stdout).toBe(urls("rw_a") + urls("rw_b"));
    expect((await query(`postgres://ropewalk_app@127.0.0.1:${port}/rw_b`, "select 1 as one"))[0]).toEqual({ one: 1 });
  });

  it("status is running (0), then stop, then status is stopped (3)", async () => {
    const up = await run("status.sh", [], env);
    expect([up.code, up.stdout.trim()]).toEqual([0, "running"]);

    const stop = await run("stop.sh", [], env);
    expect(stop.code).toBe(0);
    expect(await canConnect("127.0.0.1", port)).toBe(false);

    const down = await run("status.sh", [], env);
    expect([down.code, down.stdout.trim()]).toEqual([3, "stopped"]);

    const again = await run("stop.sh", [], env); // fine when not running
    expect(again.code).toBe(0);
  });

  it("refuses a port held by another process, naming the port, before creating anything", async () => {
    const held = await freePort();
    const server = createServer();
    heldServers.push(server);
    await new Promise<void>((done) => server.listen(held, "127.0.0.1", () => done()));
    const data = join(tmp, "held-data");
    const r = await run("start.sh", [DB], { ...env, PGPORT: String(held), RW_PGDATA: data });
    expect(r.code).not.toBe(0);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain(`port ${held}`);
    expect(existsSync(data)).toBe(false);
  });

  it("refuses a data folder it did not create, leaving it untouched", async () => {
    const data = join(tmp, "foreign");
    mkdirSync(data);
    writeFileSync(join(data, "PG_VERSION"), "15\n");
    const foreign = { ...env, RW_PGDATA: data };
    for (const script of ["start.sh", "stop.sh", "reset.sh"]) {
      const r = await run(script, [], foreign);
      expect(r.code, script).not.toBe(0);
      expect(r.stderr, script).toContain(".ropewalk-cluster");
    }
    const st = await run("status.sh", [], foreign);
    expect([st.code, st.stdout.trim()]).toEqual([3, "absent"]);
    expect(readdirSync(data)).toEqual(["PG_VERSION"]);
  });

  // Only root can hand a folder to another user; as root the expected owner is "postgres".
  it.runIf(process.getuid?.() === 0)("refuses our data folder when someone else owns it", async () => {
    const data = join(tmp, "not-owned");
    mkdirSync(data);
    writeFileSync(join(data, ".ropewalk-cluster"), "marker\n");
    chownSync(data, 65534, 65534); // nobody:nogroup on Debian
    const r = await run("start.sh", [DB], { ...env, RW_PGDATA: data, PGPORT: String(await freePort()) });
    expect(r.code).not.toBe(0);
    expect(r.stderr).toMatch(/owned by/);
    expect(readdirSync(data)).toEqual([".ropewalk-cluster"]);
  });

  it("reset stops a running cluster and deletes its folder", async () => {
    expect((await run("start.sh", [DB], env)).code).toBe(0);
    const r = await run("reset.sh", [], env);
    expect(r.code).toBe(0);
    expect(existsSync(env.RW_PGDATA)).toBe(false);
    expect(await canConnect("127.0.0.1", port)).toBe(false);
    const st = await run("status.sh", [], env);
    expect([st.code, st.stdout.trim()]).toEqual([3, "absent"]);
    expect((await run("reset.sh", [], env)).code).toBe(0); // nothing left to reset
  });
});
