import { Argument } from "commander";

/**
 * The `<region>` argument shared by every command: the path of a region folder (the folder that
 * holds region.json), absolute or relative to the current folder.
 *
 * @returns a fresh commander Argument, to pass to `command.addArgument(...)`
 * @example
 * new Command("check").addArgument(regionArgument());
 */
export function regionArgument(): Argument {
  return new Argument("<region>", "region folder (the folder that holds region.json)");
}
