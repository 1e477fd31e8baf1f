/**
 * Browser test runner (npm run test:browser).
 * 1. Finds Chromium (CHROME_PATH or /usr/bin/chromium); without it prints one line and
 *    exits 1 when CI is set, 0 otherwise.
 * 2. Builds the app (next build) unless .next holds a build newer than every source file.
 * 3. Starts `next start` on a free port with a fresh temporary database (migrated and
 *    seeded) and a temporary STORAGE_DIR.
 * 4. Runs tests/browser/**\/*.test.ts with vitest (tests/browser/vitest.config.ts), which
 *    drive Chromium through playwright-core; then stops the server.
 * Options: any extra arguments go to vitest (e.g. a file name or -t "pattern").
 * Env: STOKELINE_SCREENSHOTS=<dir> saves checkpoint screenshots; STOKELINE_SKIP_BUILD=1 reuses .next as is.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, mkdtempSync, readdirSync, rmSync, statSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const nextBin = path.join(root, "node_modules", ".bin", "next");
const vitestBin = path.join(root, "node_modules", ".bin", "vitest");

function findChromium(): string | null {
  const candidate = process.env.CHROME_PATH || "/usr/bin/chromium";
  return existsSync(candidate) ? candidate : null;
}

/** Newest modification time (ms) of any file under the given paths, skipping node_modules/.next/data. */
function newestMtime(paths: string[]): number {
  let newest = 0;
  const walk = (p: string) => {
    if (!existsSync(p)) return;
    const st = statSync(p);
    if (st.isDirectory()) {
      for (const name of readdirSync(p)) if (!["node_modules", ".next", "data", ".git"].includes(name)) walk(path.join(p, name));
    } else newest = Math.max(newest, st.mtimeMs);
  };
  paths.forEach((p) => walk(path.join(root, p)));
  return newest;
}

function buildIsFresh(): boolean {
  const buildId = path.join(root, ".next", "BUILD_ID");
  if (!existsSync(buildId)) return false;
  const inputs = ["app", "components", "lib", "db", "public", "next.config.mjs", "tailwind.config.ts", "postcss.config.mjs", "package.json", "tsconfig.json"];
  return statSync(buildId).mtimeMs > newestMtime(inputs);
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const address = srv.address();
      const port = typeof address === "object" && address ? address.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

async function waitForServer(url: string, server: ChildProcess, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`next start exited early with code ${server.exitCode}`);
    try {
      const res = await fetch(url, { redirect: "manual" });
      if (res.status < 500) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`the app did not answer at ${url} within ${timeoutMs / 1000} s`);
}

function stop(server: ChildProcess | undefined): void {
  if (!server || server.exitCode !== null || server.pid === undefined) return;
  try {
    process.kill(-server.pid, "SIGTERM");
  } catch {
    // already gone
  }
}

async function main(): Promise<number> {
  const chromium = findChromium();
  if (!chromium) {
    const where = process.env.CHROME_PATH || "/usr/bin/chromium";
    console.log(`Browser tests not run: Chromium not found at ${where} (install the chromium package or set CHROME_PATH).`);
    return process.env.CI ? 1 : 0;
  }

  if (process.env.STOKELINE_SKIP_BUILD !== "1" && !buildIsFresh()) {
    console.log("Building the app for browser tests (next build)…");
    const build = spawnSync(nextBin, ["build"], { cwd: root, stdio: "inherit", env: { ...process.env, NODE_ENV: "production", NEXT_TELEMETRY_DISABLED: "1" } });
    if (build.status !== 0) {
      console.error("next build failed; browser tests not run.");
      return build.status ?? 1;
    }
  }

  const work = mkdtempSync(path.join(tmpdir(), "stokeline-browser-"));
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    DATABASE_URL: `file:${path.join(work, "browser.db")}`,
    DATABASE_AUTH_TOKEN: "",
    STORAGE_DIR: path.join(work, "files"),
    NEXTAUTH_SECRET: randomBytes(32).toString("base64url"),
    NEXTAUTH_URL: baseUrl,
    SMTP_URL: "",
    NEXT_TELEMETRY_DISABLED: "1",
  };

  // Migrate and seed the fresh database in a child (same code path as `npm run dev`).
  const prepare = spawnSync(path.join(root, "node_modules", ".bin", "tsx"), ["--conditions=react-server", "scripts/prepare-db.ts"], { cwd: root, stdio: "inherit", env });
  if (prepare.status !== 0) return prepare.status ?? 1;

  let server: ChildProcess | undefined;
  const cleanup = () => {
    stop(server);
    rmSync(work, { recursive: true, force: true });
  };
  process.once("SIGINT", () => {
    cleanup();
    process.exit(130);
  });
  try {
    server = spawn(nextBin, ["start", "-p", String(port), "-H", "127.0.0.1"], { cwd: root, env, detached: true, stdio: ["ignore", "pipe", "pipe"] });
    let serverLog = "";
    server.stdout?.on("data", (d: Buffer) => (serverLog += d.toString()));
    server.stderr?.on("data", (d: Buffer) => (serverLog += d.toString()));
    try {
      await waitForServer(`${baseUrl}/sign-in`, server, 90_000);
    } catch (err) {
      console.error(`Could not start the app: ${(err as Error).message}\n${serverLog.slice(-4000)}`);
      return 1;
    }
    console.log(`App under test at ${baseUrl}; running browser tests with ${chromium}.`);
    const run = spawnSync(vitestBin, ["run", "--config", "tests/browser/vitest.config.ts", ...process.argv.slice(2)], {
      cwd: root,
      stdio: "inherit",
      env: { ...env, NODE_ENV: "test", STOKELINE_BASE_URL: baseUrl, CHROME_PATH: chromium },
    });
    if (run.status !== 0 && process.env.STOKELINE_SERVER_LOG) console.error(serverLog.slice(-8000));
    return run.status ?? 1;
  } finally {
    cleanup();
  }
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(`Browser test runner failed: ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  },
);
