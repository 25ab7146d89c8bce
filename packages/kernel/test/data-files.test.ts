/**
 * Pinned data files read for a run: their bytes must be UTF-8 and they must lie inside the document's folder,
 * also when reached through a symbolic link.
 */
import { mkdir, mkdtemp, symlink, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { sha256Hex, utf8Bytes } from "@conebook/document";
import { checkDataPins, createKernel } from "../src/index.js";
import { fileReaderFor } from "../src/node.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();

describe("a pinned data file", () => {
  it("that is not UTF-8 is refused with the byte offset instead of turning numbers into text", async () => {
    const bytes = Uint8Array.from([...utf8Bytes("t_s,s_m\n60,0.31\n120,0."), 0xff, 0xfe, ...utf8Bytes("52\n")]);
    const doc = makeDoc([{ kind: "data", name: "obs", file: { path: "obs.csv", sha256: sha256Hex(bytes) } }, "obs.rows[1]"]);
    const r = await kernel.runDocument(doc, { readFile: () => bytes });
    expect(r.outputs.c1).toEqual([
      { type: "error", message: "DataCellError: data \"obs\": the file obs.csv is not UTF-8 at byte offset 22 (line 3, column 7): bytes FF FE are not UTF-8; save it as UTF-8 (and pin the new bytes)", line: 5 },
    ]);
    expect(r.status.c2).toBe("not-run");
  });

  it("that is not UTF-8 is reported by the pin check", async () => {
    const bytes = Uint8Array.from([0x74, 0x0a, 0x31, 0xc0, 0xaf]);
    const doc = makeDoc([{ kind: "data", name: "obs", file: { path: "obs.csv", sha256: sha256Hex(bytes) } }]);
    expect(await checkDataPins(doc, () => bytes)).toMatchObject([{ status: "not-utf8", reason: "byte offset 3 (line 2, column 2): bytes C0 AF are not UTF-8" }]);
  });

  it("that is a symbolic link to a file outside the document's folder is refused", async () => {
    const root = await mkdtemp(join(tmpdir(), "conebook-links-"));
    const folder = join(root, "site");
    await mkdir(join(folder, "data"), { recursive: true });
    await writeFile(join(root, "secret.csv"), "t,s\n1,2\n");
    await writeFile(join(folder, "data", "inside.csv"), "t,s\n1,2\n");
    await symlink(join(root, "secret.csv"), join(folder, "data", "outside.csv"));
    await symlink(join(folder, "data", "inside.csv"), join(folder, "near.csv"));
    await symlink(root, join(folder, "up"));
    const read = fileReaderFor(folder);
    await expect(read("data/outside.csv")).rejects.toThrow(/data\/outside\.csv leads outside the document's folder .*; data files must sit beside the document, not be links to elsewhere/);
    await expect(read("up/secret.csv")).rejects.toThrow(/leads outside the document's folder/);
    expect(new TextDecoder().decode(await read("near.csv"))).toBe("t,s\n1,2\n");
    await expect(read("../secret.csv")).rejects.toThrow(/outside the document's folder/);
  });
});
