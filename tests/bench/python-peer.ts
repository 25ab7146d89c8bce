/**
 * The Python side of the bench: a virtual environment with the newest scipy pip can install, made by the bench
 * itself (node_modules/.cache/conebook-bench/venv; the tests never need it), and the persistent peer process
 * (peer/peer_server.py) that answers one measurement round per request.
 *
 * Where scipy comes from, in order: the Python registry itself (pip with `--isolated`, which ignores this machine's
 * pip configuration and so asks the registry); when the registry cannot be reached, the package indexes pip is
 * configured with on this machine; when that fails too, Debian's python3-scipy (/usr/bin/python3). The bench prints
 * which one it used and the versions, and says so when the registry was not reachable.
 */
import { spawn, spawnSync, type ChildProcessWithoutNullStreams } from "node:child_process";
import { existsSync, mkdirSync } from "node:fs";
import { join } from "node:path";
import { createInterface } from "node:readline";
import { fileURLToPath } from "node:url";

const ROOT = fileURLToPath(new URL("../../", import.meta.url));
const VENV = join(ROOT, "node_modules", ".cache", "conebook-bench", "venv");
const SERVER = fileURLToPath(new URL("./peer/peer_server.py", import.meta.url));
const SYSTEM_PYTHON = "/usr/bin/python3";
/** Variables that pin OpenBLAS to an old kernel on this machine; they slow a current numpy and are left out for it. */
const OPENBLAS_PINS = ["OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE"];

/** The Python a peer runs on, with where its scipy came from. */
export interface PythonChoice {
  python: string;
  /** Lines for the bench's output: the source of scipy and anything the reader should know. */
  notes: string[];
  /** True for the bench's own environment (a current numpy: OpenBLAS pins are dropped for it). */
  own: boolean;
}

function lastLine(text: string): string {
  return text.trim().split("\n").filter((l) => l.trim() !== "").pop() ?? "";
}

let chosen: PythonChoice | undefined;

/** Makes (or reuses) the virtual environment and installs the newest scipy available; see the module comment. */
export function preparePython(): PythonChoice {
  if (chosen) return chosen;
  if (process.env.CONEBOOK_PYTHON) {
    chosen = { python: process.env.CONEBOOK_PYTHON, notes: [`scipy peer: CONEBOOK_PYTHON=${process.env.CONEBOOK_PYTHON}`], own: false };
    return chosen;
  }
  const notes: string[] = [];
  const python = join(VENV, "bin", "python");
  if (!existsSync(python)) {
    mkdirSync(join(VENV, ".."), { recursive: true });
    const made = spawnSync(SYSTEM_PYTHON, ["-m", "venv", VENV], { encoding: "utf8" });
    if (made.status !== 0) {
      chosen = { python: SYSTEM_PYTHON, notes: [`scipy peer: could not make a virtual environment (${lastLine(made.stderr)}); using Debian's scipy`], own: false };
      return chosen;
    }
  }
  const pip = (args: string[]) => spawnSync(python, ["-m", "pip", "install", "--upgrade", "--disable-pip-version-check", ...args, "scipy", "numpy"], { encoding: "utf8", timeout: 600_000 });
  // Whether the registry answers: pip in isolated mode (no configuration, so only the registry) lists scipy's versions.
  const probe = spawnSync(python, ["-m", "pip", "index", "versions", "scipy", "--isolated", "--retries", "0", "--timeout", "15", "--disable-pip-version-check"], { encoding: "utf8", timeout: 120_000 });
  const registry = probe.status === 0 ? pip(["--isolated", "--retries", "0", "--timeout", "15"]) : probe;
  if (registry.status === 0) notes.push("scipy peer: scipy and numpy installed from the Python registry into the bench's virtual environment");
  else {
    const output = `${registry.stderr}\n${registry.stdout}`;
    const network = output.split("\n").find((l) => /Failed to establish a new connection|Name or service not known|Temporary failure in name resolution|Network is unreachable/.test(l));
    const reason = network ? network.replace(/^.*?(Failed to establish|Name or service|Temporary failure|Network is)/, "$1").replace(/['")]+$/, "") : lastLine(output);
    notes.push(`scipy peer: the Python registry is not reachable from this machine (pip --isolated, which asks the registry alone: ${reason})`);
    const configured = pip([]);
    const indexes = spawnSync(python, ["-m", "pip", "config", "list"], { encoding: "utf8" }).stdout.trim().split("\n").filter((l) => /index-url|find-links/.test(l));
    if (configured.status === 0) {
      notes.push(`scipy peer: installed instead the newest scipy and numpy that the package indexes configured for pip on this machine hold (${indexes.join("; ") || "pip's configuration"})`);
    } else {
      notes.push(`scipy peer: pip could not install scipy from the configured indexes either (${lastLine(configured.stderr)}); falling back to Debian's scipy`);
      chosen = { python: SYSTEM_PYTHON, notes, own: false };
      return chosen;
    }
  }
  chosen = { python, notes, own: true };
  return chosen;
}

/** The environment a peer process runs with: OpenBLAS pins dropped for the bench's own numpy (see the constant). */
export function peerEnvironment(choice: PythonChoice): NodeJS.ProcessEnv {
  const env = { ...process.env };
  if (choice.own) for (const name of OPENBLAS_PINS) delete env[name];
  return env;
}

/** One persistent peer process: requests and answers are JSON lines (see peer/peer_server.py). */
export class PeerProcess {
  private readonly child: ChildProcessWithoutNullStreams;
  private readonly waiting: ((line: string) => void)[] = [];
  private stderr = "";

  private constructor(choice: PythonChoice) {
    this.child = spawn(choice.python, [SERVER], { env: peerEnvironment(choice), stdio: ["pipe", "pipe", "pipe"] });
    this.child.stderr.on("data", (d: Buffer) => (this.stderr += d.toString()));
    createInterface({ input: this.child.stdout }).on("line", (line) => this.waiting.shift()?.(line));
    this.child.on("exit", () => {
      for (const w of this.waiting.splice(0)) w(JSON.stringify({ error: `the peer ended: ${lastLine(this.stderr)}` }));
    });
  }

  /** Starts the peer on the prepared Python; null (with the reason printed) when it cannot answer. */
  static async start(choice: PythonChoice): Promise<{ peer: PeerProcess; versions: Record<string, string> } | null> {
    const peer = new PeerProcess(choice);
    const versions = await peer.ask({ case: "versions" }).catch((e: Error) => ({ error: e.message }));
    if ("error" in versions) {
      console.log(`scipy peer unavailable: ${String(versions.error)}`);
      peer.close();
      return null;
    }
    return { peer, versions: versions as Record<string, string> };
  }

  /** Sends one request and resolves with its answer; rejects with the peer's error. */
  ask(request: Record<string, unknown>): Promise<Record<string, unknown>> {
    return new Promise((resolve, reject) => {
      this.waiting.push((line) => {
        const answer = JSON.parse(line) as Record<string, unknown>;
        if (typeof answer.error === "string") reject(new Error(answer.error));
        else resolve(answer);
      });
      this.child.stdin.write(`${JSON.stringify(request)}\n`);
    });
  }

  close(): void {
    this.child.stdin.end();
  }
}
