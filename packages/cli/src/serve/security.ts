/**
 * The rules every request to `conebook serve` passes before anything is read:
 *
 *   - it arrives on the loopback interface (the server listens on 127.0.0.1 only);
 *   - its Host header names this server (127.0.0.1:PORT or localhost:PORT), which defeats DNS rebinding;
 *   - its path starts with the per-start token (`/TOKEN/...`), so only someone given the printed URL gets in;
 *   - an Origin header, when present, is this server's own, and a request that changes anything (PUT, POST)
 *     must carry it; a browser's Sec-Fetch-Site, when sent, must be "same-origin" (the page's own requests) or
 *     "none" (the user opened the URL); "same-site" is refused too, since another port of 127.0.0.1 is the
 *     same site but not this server;
 *   - the method is one the server serves (GET and HEAD for reading, PUT and POST on the API).
 *
 * Every response carries the page's Content-Security-Policy, which allows no remote origin.
 */
import { randomBytes, timingSafeEqual } from "node:crypto";
import type { IncomingMessage } from "node:http";

/**
 * The page's Content-Security-Policy: scripts, workers, styles, fonts and fetches from this server only;
 * 'wasm-unsafe-eval' lets the kernel compile its QuickJS wasm (no JavaScript eval is allowed); inline styles
 * are allowed because the editor and the chart library set element styles (they cannot run script).
 */
export const PAGE_CSP = [
  "default-src 'none'",
  "script-src 'self' 'wasm-unsafe-eval'",
  "worker-src 'self'",
  "connect-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data:",
  "font-src 'self'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join("; ");

/** Headers on every response. */
export const SECURITY_HEADERS: Readonly<Record<string, string>> = {
  "content-security-policy": PAGE_CSP,
  "x-content-type-options": "nosniff",
  "referrer-policy": "no-referrer",
  "cross-origin-opener-policy": "same-origin",
  "cross-origin-resource-policy": "same-origin",
  "cache-control": "no-store",
};

/** A new random token: 24 bytes as base64url (192 bits). */
export function newToken(): string {
  return randomBytes(24).toString("base64url");
}

/** Why a request is refused (status and message), or undefined when it passes. */
export interface Refusal {
  status: 400 | 403 | 404 | 405;
  message: string;
}

function sameText(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

/** The request's path after the token, or a Refusal. `port` is the port the server listens on. */
export function checkRequest(req: IncomingMessage, token: string, port: number): { rest: string } | Refusal {
  const hosts = [`127.0.0.1:${port}`, `localhost:${port}`];
  const host = req.headers.host ?? "";
  if (!hosts.includes(host.toLowerCase())) return { status: 403, message: `refused: the Host header ${JSON.stringify(host)} does not name this server (${hosts[0]})` };
  const origin = req.headers.origin;
  if (origin !== undefined && !hosts.some((h) => origin === `http://${h}`)) {
    return { status: 403, message: `refused: requests from ${origin} are not accepted; open the page from the URL conebook serve printed` };
  }
  const site = req.headers["sec-fetch-site"];
  if (site !== undefined && site !== "same-origin" && site !== "none") return { status: 403, message: `refused: a request from another site or origin (Sec-Fetch-Site ${site})` };
  const method = req.method ?? "";
  if (!["GET", "HEAD", "PUT", "POST"].includes(method)) return { status: 405, message: `refused: method ${method} is not served` };
  if ((method === "PUT" || method === "POST") && origin === undefined) {
    return { status: 403, message: "refused: a request that changes files must come from the page (it carries no Origin)" };
  }
  const raw = req.url ?? "/";
  if (!raw.startsWith("/")) return { status: 400, message: "refused: the request target is not a path" };
  const pathEnd = raw.search(/[?#]/);
  const path = pathEnd < 0 ? raw : raw.slice(0, pathEnd);
  const slash = path.indexOf("/", 1);
  const given = slash < 0 ? path.slice(1) : path.slice(1, slash);
  if (!sameText(given, token)) return { status: 403, message: "refused: the address lacks this server's token; open the URL conebook serve printed" };
  if (slash < 0) return { rest: "/" };
  return { rest: raw.slice(slash) };
}
