import { describe, expect, it } from "vitest";
import { UsageError } from "../src/errors.js";
import { parseSettings } from "../src/settings.js";

describe("--set", () => {
  it("refuses a name every JavaScript object already has instead of ignoring it", () => {
    for (const name of ["__proto__", "constructor", "hasOwnProperty"]) {
      expect(() => parseSettings([`${name}=1.5`], "run"), name).toThrow(UsageError);
    }
    expect(() => parseSettings(["__proto__=1.5"], "run")).toThrow(
      '--set __proto__: the name "__proto__" is reserved: every JavaScript object has a property of that name; choose another name',
    );
  });

  it("reads an ordinary name with its number and unit", () => {
    expect(parseSettings(["rate=8L/s"], "run")).toEqual([{ name: "rate", raw: "8L/s", number: 8, unit: "L/s" }]);
  });
});
