import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import pg from "pg";

// The local PostgreSQL cluster lives in a git-ignored folder (.local/<profile>/pg) and listens on
// 127.0.0.1 only. PostgreSQL refuses to run as root, so as root the server runs as an unprivileged
// OS user ("postgres" from Debian's package, or one we create).

export type ClusterOptions = {
  dir: string; // data directory
  port: number;
  database: string;
  role?: string;
  fast?: boolean; // throw-away clusters trade durability for speed
  log?: (line: string) => void;
};

export type Cluster = { url: string; startedHere: boolean; stop: () => Promise<void> };

function pgBinDir(): string {
  const root = "/usr/lib/postgresql";
  const versions = fs.existsSync(root) ? fs.readdirSync(root).filter((v) => fs.existsSync(path.join(root, v, "bin", "initdb"))) : [];
  versions.sort((a, b) => Number(b) - Number(a));
  if (!versions[0]) {
    throw new Error("PostgreSQL server binaries not found under /usr/lib/postgresql; run `npm start` to install them");
  }
  return path.join(root, versions[0], "bin");
}

const isRoot = () => typeof process.getuid === "function" && process.getuid() === 0;

function serverUser(): string | null {
  if (!isRoot()) return null;
  for (const name of ["postgres", "loadline-pg"]) {
    if (spawnSync("id", ["-u", name]).status === 0) return name;
  }
  execFileSync("useradd", ["--system", "--no-create-home", "--shell", "/usr/sbin/nologin", "loadline-pg"]);
  return "loadline-pg";
}

// The server user must be able to walk down to the data directory.
function grantTraverse(dir: string, user: string) {
  let current = path.resolve(dir);
  const chain: string[] = [];
  while (current !== path.dirname(current)) {
    current = path.dirname(current);
    chain.push(current);
  }
  for (const folder of chain.reverse()) {
    if (spawnSync("runuser", ["-u", user, "--", "test", "-x", folder]).status !== 0) {
      fs.chmodSync(folder, fs.statSync(folder).mode | 0o001);
    }
  }
}

function run(user: string | null, bin: string, args: string[], log?: (l: string) => void) {
  const [cmd, argv] = user ? ["runuser", ["-u", user, "--", bin, ...args]] : [bin, args];
  const result = spawnSync(cmd, argv, { encoding: "utf8" });
  if (result.status !== 0) {
    throw new Error(`${path.basename(bin)} failed (${result.status}): ${result.stderr || result.stdout}`);
  }
  if (log && result.stdout.trim()) log(result.stdout.trim());
  return result.stdout;
}

function isReady(bin: string, port: number): boolean {
  return spawnSync(path.join(bin, "pg_isready"), ["-q", "-h", "127.0.0.1", "-p", String(port)]).status === 0;
}

export async function startCluster(opts: ClusterOptions): Promise<Cluster> {
  const bin = pgBinDir();
  const role = opts.role ?? "loadline";
  const user = serverUser();
  const dir = path.resolve(opts.dir);
  const log = opts.log ?? (() => {});
  const url = `postgres://${role}@127.0.0.1:${opts.port}/${opts.database}`;

  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (user) {
    grantTraverse(dir, user);
    execFileSync("chown", ["-R", `${user}:`, path.dirname(dir)]);
  }
  if (!fs.existsSync(path.join(dir, "PG_VERSION"))) {
    log(`Creating a PostgreSQL cluster in ${path.relative(process.cwd(), dir)}`);
    // Trust on loopback only: this cluster is a developer's private scratch database.
    run(user, path.join(bin, "initdb"), ["-D", dir, "-U", role, "-A", "trust", "-E", "UTF8", "--no-locale"]);
  }

  let startedHere = false;
  if (!isReady(bin, opts.port)) {
    const settings = [
      "-c listen_addresses=127.0.0.1",
      `-c port=${opts.port}`,
      "-c unix_socket_directories=''",
      "-c max_connections=60",
      ...(opts.fast ? ["-c fsync=off", "-c synchronous_commit=off", "-c full_page_writes=off"] : []),
    ].join(" ");
    const logFile = path.join(path.dirname(dir), "postgres.log");
    run(user, path.join(bin, "pg_ctl"), ["-D", dir, "-l", logFile, "-w", "-t", "60", "-o", settings, "start"]);
    startedHere = true;
  }

  const admin = new pg.Client({ connectionString: `postgres://${role}@127.0.0.1:${opts.port}/postgres` });
  await admin.connect();
  try {
    const found = await admin.query("SELECT 1 FROM pg_database WHERE datname = $1", [opts.database]);
    if (found.rowCount === 0) await admin.query(`CREATE DATABASE "${opts.database}"`);
  } finally {
    await admin.end();
  }

  return {
    url,
    startedHere,
    stop: async () => {
      if (!startedHere) return;
      run(user, path.join(bin, "pg_ctl"), ["-D", dir, "-m", "fast", "-w", "stop"]);
    },
  };
}

export async function createDatabase(clusterUrl: string, name: string, { fresh = false } = {}) {
  const adminUrl = new URL(clusterUrl);
  adminUrl.pathname = "/postgres";
  const admin = new pg.Client({ connectionString: adminUrl.toString() });
  await admin.connect();
  try {
    if (fresh) await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    const found = await admin.query("SELECT 1 FROM pg_database WHERE datname = $1", [name]);
    if (found.rowCount === 0) await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
  const url = new URL(clusterUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

export async function dropDatabase(clusterUrl: string, name: string) {
  const adminUrl = new URL(clusterUrl);
  adminUrl.pathname = "/postgres";
  const admin = new pg.Client({ connectionString: adminUrl.toString() });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  } finally {
    await admin.end();
  }
}
