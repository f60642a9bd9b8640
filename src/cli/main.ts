#!/usr/bin/env node
import { realpathSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { Command } from "commander";
import { handleError } from "./handleError.js";
import { terminalSafe } from "./terminalText.js";
import { firephaseVersion } from "./version.js";

/**
 * Each command and the module that defines it. A module is imported only when its command runs
 * (or for the program's help), so `check` never loads the browser, the charts or the statistics
 * libraries, and `--version` loads no command at all: start-up time is paid per module.
 */
const COMMANDS: readonly (readonly [string, () => Promise<Command>])[] = [
  ["check", async () => (await import("./check.js")).checkCommand()],
  ["calibrate", async () => (await import("./calibrate.js")).calibrateCommand()],
  ["outlook", async () => (await import("./outlook.js")).outlookCommand()],
  ["brief", async () => (await import("./brief.js")).briefCommand()],
  ["review", async () => (await import("./review.js")).reviewCommand()],
];

/**
 * The commands the arguments need: the one named first, none for `--version`, else all of them
 * (help, an unknown command, no arguments).
 */
function commandsFor(argv: readonly string[]): readonly (readonly [string, () => Promise<Command>])[] {
  const first = argv[0];
  const named = COMMANDS.find(([name]) => name === first);
  if (named !== undefined) return [named];
  if (argv.length === 1 && (first === "-V" || first === "--version")) return [];
  return COMMANDS;
}

/**
 * The firephase program, with commander's exits turned into thrown errors (`exitOverride`) so
 * that {@link runCli} decides the exit code through `handleError`.
 *
 * @param argv - the arguments the program will parse: only the commands they need are loaded
 *   (default: none given, so every command is loaded).
 * @returns a fresh program; parse it with `parseAsync(argv, { from: "user" })`
 */
export async function createProgram(argv: readonly string[] = []): Promise<Command> {
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
  for (const command of await Promise.all(commandsFor(argv).map(([, load]) => load()))) {
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
    await (await createProgram(argv)).parseAsync([...argv], { from: "user" });
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
