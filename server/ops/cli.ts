/**
 * The shape of Phasebook's command-line tools: a refusal is one sentence on stderr and a
 * non-zero exit code, never a stack trace. Configuration errors exit 2, refusals 1.
 */
import { parseArgs, type ParseArgsConfig } from "node:util";
import { ConfigError } from "../config";

/** A refusal the operator can act on (from a command or a job); its message is the whole answer. */
export class Refusal extends Error {
  constructor(
    message: string,
    readonly exitCode = 1,
  ) {
    super(message);
  }
}

/** node:util's parseArgs, with its errors (unknown option, missing value) turned into refusals. */
export function readArgs<T extends ParseArgsConfig>(config: T, usage: string) {
  try {
    return parseArgs(config);
  } catch (e) {
    throw new Refusal(`${(e as Error).message.replace(/\.$/, "")}. Usage: ${usage}`, 2);
  }
}

/** Runs a command's body; whatever it throws leaves as one sentence and an exit code. */
export async function runCli(what: string, body: () => Promise<void>): Promise<void> {
  try {
    await body();
  } catch (e) {
    if (e instanceof Refusal) {
      console.error(e.message);
      process.exit(e.exitCode);
    }
    if (e instanceof ConfigError) {
      console.error(e.message);
      process.exit(2);
    }
    console.error(`${what} failed: ${(e as Error)?.message ?? String(e)}`);
    process.exit(1);
  }
}
