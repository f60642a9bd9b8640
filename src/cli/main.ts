#!/usr/bin/env node
import { realpathSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { Command } from "commander";
import { briefCommand } from "./brief.js";
import { calibrateCommand } from "./calibrate.js";
import { checkCommand } from "./check.js";
import { handleError } from "./handleError.js";
import { outlookCommand } from "./outlook.js";
import { reviewCommand } from "./review.js";
import { terminalSafe } from "./terminalText.js";
import { firephaseVersion } from "./version.js";

/**
 * The firephase program: every command, with commander's exits turned into thrown errors
 * (`exitOverride`) so that {@link runCli} decides the exit code through `handleError`.
 *
 * @returns a fresh program; parse it with `parseAsync(argv, { from: "user" })`
 */
export function createProgram(): Command {
  const program = new Command("firephase")
    .description(
      "Calibrated odds of a high-fire year from a region's fire-scar record and winter-spring climate-index phases. " +
        "A statistical outlook: official agency outlooks and fire-danger ratings come first (see SAFETY.md).",
    )
    .version(firephaseVersion(), "-V, --version", "print the version")
    .exitOverride()
    .configureOutput({
      writeOut: (text) => process.stdout.write(terminalSafe(text)),
      writeErr: (text) => process.stderr.write(terminalSafe(text)),
      // Commander's own usage errors get the one prefix of every firephase error line.
      outputError: (text, write) => write(`firephase: ${text.replace(/^error: /, "")}`),
    })
    .showHelpAfterError("(run firephase --help for usage)");
  for (const command of [checkCommand(), calibrateCommand(), outlookCommand(), briefCommand(), reviewCommand()]) {
    command.copyInheritedSettings(program);
    command.showHelpAfterError(`(run firephase ${command.name()} --help for usage)`);
    program.addCommand(command);
  }
  return program;
}

/**
 * Run firephase with the given arguments (without the node and script paths) and return the exit
 * code: 0 done, 1 bad input or data, 2 bad usage. Output goes to process.stdout and stderr.
 *
 * @param argv - the command-line arguments, e.g. ["check", "demo-region", "--json"]
 * @returns the exit code
 * @example
 * process.exitCode = await runCli(["check", "demo-region"]);
 */
export async function runCli(argv: readonly string[]): Promise<number> {
  process.exitCode = undefined;
  try {
    await createProgram().parseAsync([...argv], { from: "user" });
  } catch (error) {
    handleError(error);
  }
  return Number(process.exitCode ?? 0);
}

function isEntryPoint(): boolean {
  const script = process.argv[1];
  if (script === undefined) return false;
  try {
    return realpathSync(script) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isEntryPoint()) {
  process.exitCode = await runCli(process.argv.slice(2));
}
