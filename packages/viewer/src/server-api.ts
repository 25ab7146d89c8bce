/**
 * The page's calls to `conebook serve` (packages/cli/src/serve/server.ts). All URLs are relative to the page,
 * which lives under the server's token prefix, so the token goes with every call without being handled here.
 */
import type { PinCheck } from "@conebook/kernel";

/** The session: the served folder's name, its documents, and the one to open first. */
export interface Session {
  folder: string;
  documents: string[];
  initial: string | null;
}

/** A document as opened. */
export interface Opened {
  path: string;
  text: string;
  sha256: string;
  pins: PinCheck[];
}

/** A save's outcome. */
export type SaveReply = { status: "saved"; sha256: string } | { status: "conflict"; text: string; sha256: string } | { status: "error"; message: string };

/** A request the server refused or could not serve; the message is the server's. */
export class ServerError extends Error {
  override readonly name = "ServerError";
  constructor(
    message: string,
    readonly status: number,
  ) {
    super(message);
  }
}

async function json<T>(response: Response): Promise<T> {
  const text = await response.text();
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new ServerError(`the server answered ${response.status} with something that is not JSON: ${text.slice(0, 200)}`, response.status);
  }
  if (!response.ok) throw new ServerError((body as { error?: string }).error ?? `the server answered ${response.status}`, response.status);
  return body as T;
}

export async function getSession(): Promise<Session> {
  return json<Session>(await fetch("api/session"));
}

export async function openDocument(path: string): Promise<Opened> {
  return json<Opened>(await fetch(`api/document?path=${encodeURIComponent(path)}`));
}

/** Saves `text` over `path` if the file is still the one with `baseSha256`; a conflict brings the disk's text. */
export async function saveDocument(path: string, text: string, baseSha256: string): Promise<SaveReply> {
  let response: Response;
  try {
    response = await fetch(`api/document?path=${encodeURIComponent(path)}`, {
      method: "PUT",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ text, baseSha256 }),
    });
  } catch (e) {
    return { status: "error", message: `the server could not be reached (${(e as Error).message}); is conebook serve still running?` };
  }
  const body = (await response.json().catch(() => ({}))) as { sha256?: string; text?: string; error?: string };
  if (response.ok && body.sha256) return { status: "saved", sha256: body.sha256 };
  if (response.status === 409 && typeof body.text === "string" && typeof body.sha256 === "string") return { status: "conflict", text: body.text, sha256: body.sha256 };
  return { status: "error", message: body.error ?? `the server answered ${response.status}` };
}

/** Writes `text` as a new copy beside `path`; returns the copy's path. */
export async function saveCopy(path: string, text: string): Promise<string> {
  const r = await fetch(`api/copy?path=${encodeURIComponent(path)}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ text }) });
  return (await json<{ path: string }>(r)).path;
}

/** The bytes of a data file pinned by the document at `documentPath`. */
export async function readDataFile(documentPath: string, dataPath: string): Promise<Uint8Array> {
  const r = await fetch(`api/data?document=${encodeURIComponent(documentPath)}&path=${encodeURIComponent(dataPath)}`);
  if (!r.ok) {
    const body = (await r.json().catch(() => ({}))) as { error?: string };
    throw new ServerError(body.error ?? `the server answered ${r.status} for ${dataPath}`, r.status);
  }
  return new Uint8Array(await r.arrayBuffer());
}

/** Writes a new document and its data files (paths relative to it); refused (409) when a file is in the way. */
export async function createDocument(path: string, text: string, files: readonly { path: string; bytes: Uint8Array }[]): Promise<{ path: string; sha256: string }> {
  const base64 = (bytes: Uint8Array): string => {
    let s = "";
    for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
    return btoa(s);
  };
  const r = await fetch(`api/new?path=${encodeURIComponent(path)}`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ text, files: files.map((f) => ({ path: f.path, base64: base64(f.bytes) })) }),
  });
  return json<{ path: string; sha256: string }>(r);
}
