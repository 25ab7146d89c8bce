/** Versions recorded in documents and reports: this tool's and the aquifer library's (package versions). */
import cliPackage from "../package.json" with { type: "json" };
import aquiferPackage from "../../aquifer/package.json" with { type: "json" };
import kernelPackage from "../../kernel/package.json" with { type: "json" };

/** Version of `@conebook/cli`. */
export const TOOL_VERSION: string = cliPackage.version;
/** Version of `@conebook/aquifer`, written to a document's `recordedWith` by `run --write`. */
export const AQUIFER_VERSION: string = aquiferPackage.version;
/** Version of the type stripper the kernel runs (part of the key of a kept stripped cell). */
export const SUCRASE_VERSION: string = kernelPackage.dependencies.sucrase;
