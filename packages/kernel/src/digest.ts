/**
 * SHA-256 of data files on the host: the platform's implementation (WebCrypto's `crypto.subtle.digest`, present in
 * Node 20, browsers and workers), natively and off the main loop; the pure TypeScript one of @conebook/document
 * (FIPS 180-4, with its test vectors) only where no platform hash exists.
 */
import { sha256Hex } from "@conebook/document";

/** Computes the SHA-256 of bytes as 64 lowercase hexadecimal digits. */
export type Sha256 = (bytes: Uint8Array) => Promise<string> | string;

interface SubtleDigest {
  digest(algorithm: "SHA-256", data: Uint8Array): Promise<ArrayBuffer>;
}

const subtle = (globalThis as unknown as { crypto?: { subtle?: SubtleDigest } }).crypto?.subtle;

function hex(digest: ArrayBuffer): string {
  const bytes = new Uint8Array(digest);
  let out = "";
  for (let i = 0; i < bytes.length; i++) out += bytes[i]!.toString(16).padStart(2, "0");
  return out;
}

/** The SHA-256 of `bytes` (FIPS 180-4) with the platform's WebCrypto, or the pure implementation without it. */
export async function platformSha256(bytes: Uint8Array): Promise<string> {
  if (subtle === undefined) return sha256Hex(bytes);
  return hex(await subtle.digest("SHA-256", bytes));
}
