/**
 * Writing output files so that a reader never sees a half-written file and a failure leaves
 * nothing behind: each file is written to a temporary name in its own folder, flushed to disk,
 * and renamed over the target (rename within one folder is atomic on POSIX file systems). When
 * several files are written together and a later rename fails, the targets already renamed are
 * put back as they were (the old file restored, or the new one removed).
 */
import { randomBytes } from "node:crypto";
import { constants, existsSync, statSync } from "node:fs";
import { access, copyFile, link, lstat, open, realpath, rename, stat, unlink } from "node:fs/promises";
import { basename, dirname, join, resolve } from "node:path";

/** One file to write. */
export interface FileToWrite {
  readonly path: string;
  readonly data: string | Uint8Array;
}

/**
 * An output file that cannot be written: `cannot write <path>: <reason>`, where the path is the
 * one the caller gave and the reason is in plain words (never a temporary file's name).
 *
 * @example
 * new OutputPathError("out/brief.pdf", "the folder out does not exist").message;
 * // => "cannot write out/brief.pdf: the folder out does not exist"
 */
export class OutputPathError extends Error {
  /** The target path as the caller gave it. */
  readonly path: string;
  /** Why it cannot be written, in plain words. */
  readonly reason: string;
  constructor(path: string, reason: string) {
    super(`cannot write ${path}: ${reason}`);
    this.name = "OutputPathError";
    this.path = path;
    this.reason = reason;
  }
}

function errorCode(error: unknown): string | undefined {
  return typeof error === "object" && error !== null && "code" in error && typeof error.code === "string" ? error.code : undefined;
}

function folderExists(folder: string): boolean {
  try {
    return existsSync(folder) && statSync(folder).isDirectory();
  } catch {
    return false;
  }
}

/** A file-system error in plain words, without any path (so no temporary name leaks out). */
function reasonOf(error: unknown, path: string): string {
  const folder = dirname(path);
  switch (errorCode(error)) {
    case "ENOENT":
      // A folder that exists but refuses new files (/proc, /sys) also answers ENOENT.
      return folderExists(folder)
        ? `the folder ${folder} does not accept new files (a system folder such as /proc or /sys?)`
        : `the folder ${folder} does not exist`;
    case "ENOTDIR":
      return `${folder} is not a folder`;
    case "EISDIR":
      return "it is a folder";
    case "EACCES":
    case "EPERM":
      return "permission denied";
    case "EROFS":
      return "the file system is read-only";
    case "ENOSPC":
      return "no space left on the device";
    case "EDQUOT":
      return "the disk quota is exceeded";
    case "ENAMETOOLONG":
      return "the name is too long";
    case "EXDEV":
    case "EBUSY":
      return "the file is in use or on another device";
    default: {
      const code = errorCode(error);
      return code === undefined ? "the file system refused the write" : `the file system refused the write (${code})`;
    }
  }
}

/** Options of {@link checkOutputTargets} and {@link writeFilesAtomic}. */
export interface OutputOptions {
  /**
   * May an existing regular file be replaced? Default true. When false, an existing target is
   * refused with `it already exists` and `hint` (e.g. "give --force to replace it").
   */
  readonly replace?: boolean;
  /** Words added to the "already exists" reason, e.g. "give --force to replace it". */
  readonly hint?: string;
}

/**
 * The real location of a path that may not exist yet: the real path (links resolved) of an
 * existing file, else the real path of its folder joined with its name; when the folder does not
 * exist either, the path resolved against the working folder.
 *
 * @param path - any path
 * @returns an absolute path with every symbolic link of existing parts resolved
 * @example
 * await realTarget("rlink/indices.csv"); // rlink → region: "/abs/region/indices.csv"
 */
export async function realTarget(path: string): Promise<string> {
  try {
    return await realpath(path);
  } catch {
    try {
      return join(await realpath(dirname(path)), basename(path));
    } catch {
      return resolve(path);
    }
  }
}

/**
 * Plain-word problem with an output file name itself, before the file system is asked: an empty
 * name, or a name that ends in a path separator (a folder).
 *
 * @param path - the target as typed
 * @returns the reason, or null when the name is usable
 */
export function outputNameProblem(path: string): string | null {
  if (path.trim() === "") return "no file name was given";
  if (/[\\/]$/.test(path) || /(^|[\\/])\.{1,2}$/.test(path)) return "the name ends in a folder, not a file: add a file name";
  return null;
}

/**
 * Check, before any work is done, that a file could be written at each path: a usable name, no
 * path named twice (after resolving against the working folder and every symbolic link, or as two
 * names of one existing file), each folder exists, is a folder and is writable, and no target is
 * a folder or any other file that is not a regular file (device node, named pipe, socket — these
 * are never replaced). With `replace: false` an existing file is refused too.
 *
 * @param paths - target paths, relative to the process's working folder or absolute.
 * @param options - whether an existing regular file may be replaced (default yes).
 * @returns when every target looks writable.
 * @throws OutputPathError naming the first target that cannot be written and why.
 * @example
 * await checkOutputTargets(["brief.pdf", "brief.html"]); // resolves
 * await checkOutputTargets(["brief.pdf", "./brief.pdf"]); // throws "cannot write ./brief.pdf: it is named twice"
 * await checkOutputTargets(["/dev/null"]); // throws "cannot write /dev/null: it is not a regular file (…)"
 */
export async function checkOutputTargets(paths: readonly string[], options: OutputOptions = {}): Promise<void> {
  const seen = new Map<string, string>();
  for (const path of paths) {
    const problem = outputNameProblem(path);
    if (problem !== null) throw new OutputPathError(path, problem);
    const key = await realTarget(path);
    const earlier = seen.get(resolve(path)) ?? seen.get(key);
    if (earlier !== undefined) {
      throw new OutputPathError(path, earlier === path ? "it is named twice" : `it is named twice (also as ${earlier})`);
    }
    seen.set(resolve(path), path);
    seen.set(key, path);
  }
  const inodes = new Map<string, string>();
  for (const path of paths) {
    const folder = dirname(path);
    let folderStat;
    try {
      folderStat = await stat(folder);
    } catch (error) {
      const code = errorCode(error);
      throw new OutputPathError(
        path,
        code === "ENOENT" ? `the folder ${folder} does not exist` : code === "ENOTDIR" ? `${missingOrNotFolder(folder)}` : reasonOf(error, path),
      );
    }
    if (!folderStat.isDirectory()) throw new OutputPathError(path, `${folder} is not a folder`);
    try {
      await access(folder, constants.W_OK);
    } catch {
      throw new OutputPathError(path, `no permission to write in the folder ${folder}`);
    }
    // Ask the file system itself: some folders pass the checks above and still refuse new files
    // (/proc, /sys, a read-only mount).
    const probe = sidePath(path, "probe");
    try {
      const handle = await open(probe, "wx", 0o600);
      await handle.close();
      await unlink(probe).catch(() => undefined);
    } catch (error) {
      throw new OutputPathError(path, reasonOf(error, path));
    }
    let targetStat;
    try {
      targetStat = await stat(path);
    } catch (error) {
      if (errorCode(error) === "ENOENT") {
        // A dangling symbolic link: writing would replace the link, refuse to guess.
        const link = await lstat(path).catch(() => null);
        if (link !== null) throw new OutputPathError(path, "it is a symbolic link to a missing file");
        continue;
      }
      throw new OutputPathError(path, reasonOf(error, path));
    }
    if (targetStat.isDirectory()) throw new OutputPathError(path, "it is a folder");
    if (!targetStat.isFile()) {
      throw new OutputPathError(path, "it is not a regular file (a device, named pipe or socket), which is never replaced: choose another name");
    }
    if (options.replace === false) {
      throw new OutputPathError(path, `it already exists${options.hint === undefined ? "" : `; ${options.hint}`}`);
    }
    const inode = `${targetStat.dev}:${targetStat.ino}`;
    const other = inodes.get(inode);
    if (other !== undefined) throw new OutputPathError(path, `it is the same file as ${other}`);
    inodes.set(inode, path);
  }
}

/** Why a folder path fails with ENOTDIR: the first part of it that exists and is not a folder. */
function missingOrNotFolder(folder: string): string {
  let part = folder;
  for (let step = 0; step < 64; step += 1) {
    const parent = dirname(part);
    try {
      if (existsSync(parent) && !statSync(parent).isDirectory()) {
        part = parent;
        continue;
      }
    } catch {
      // fall through to the message below
    }
    break;
  }
  try {
    if (existsSync(part) && !statSync(part).isDirectory()) return `${part} is not a folder`;
  } catch {
    // fall through
  }
  return `${folder} is not a folder`;
}

function sidePath(path: string, suffix: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(6).toString("hex")}.${suffix}`);
}

async function writeTemporary(file: FileToWrite): Promise<string> {
  const temporary = sidePath(file.path, "tmp");
  const handle = await open(temporary, "wx", 0o644);
  try {
    await handle.writeFile(file.data);
    await handle.sync();
  } catch (error) {
    await handle.close().catch(() => undefined);
    await unlink(temporary).catch(() => undefined);
    throw error;
  }
  await handle.close();
  return temporary;
}

/**
 * A second name for an existing target, so that it can be put back if a later step fails: a hard
 * link where the file system allows one (the target itself never moves), else a copy. Null when
 * there is no target yet.
 */
async function keepOld(path: string): Promise<string | null> {
  try {
    const existing = await stat(path);
    if (!existing.isFile()) return null;
  } catch {
    return null;
  }
  const backup = sidePath(path, "old");
  try {
    await link(path, backup);
  } catch {
    await copyFile(path, backup, constants.COPYFILE_EXCL);
  }
  return backup;
}

/**
 * Write several files all-or-nothing as far as the file system allows: every file goes to a
 * temporary name beside its target first; only when all are written are they renamed into
 * place. A failure while writing removes every temporary file and leaves the targets untouched;
 * a failure while renaming puts every target already renamed back as it was (its old contents
 * restored, or the new file removed where there was none), so a failure never leaves a new
 * file behind.
 *
 * @param files - paths (relative to the working folder or absolute) and contents.
 * @param options - `replace: false` never replaces an existing file (a hard link puts each new
 *   file in place, which fails atomically when the name exists); default true. A target that
 *   exists and is not a regular file or a link (device, pipe, socket, folder) is never replaced.
 * @returns when every file is in place.
 * @throws OutputPathError `cannot write <path>: <reason>` naming the target (never a temporary
 *   name); the targets are as before and no temporary file remains.
 * @example
 * await writeFilesAtomic([{ path: "briefing.pdf", data: pdfBytes }, { path: "briefing.html", data: html }]);
 */
export async function writeFilesAtomic(files: readonly FileToWrite[], options: OutputOptions = {}): Promise<void> {
  const written: { temporary: string; path: string }[] = [];
  const placed: { path: string; backup: string | null }[] = [];
  let current = files[0]?.path ?? "";
  try {
    for (const file of files) {
      current = file.path;
      written.push({ temporary: await writeTemporary(file), path: file.path });
    }
    for (const entry of written) {
      current = entry.path;
      const existing = await lstat(entry.path).catch(() => null);
      if (existing !== null && !existing.isFile() && !existing.isSymbolicLink()) {
        throw new OutputPathError(entry.path, existing.isDirectory() ? "it is a folder" : "it is not a regular file (a device, named pipe or socket), which is never replaced: choose another name");
      }
      if (options.replace === false) {
        // link() refuses an existing name atomically: nothing is ever replaced.
        const exists = (): OutputPathError =>
          new OutputPathError(entry.path, `it already exists${options.hint === undefined ? "" : `; ${options.hint}`}`);
        try {
          await link(entry.temporary, entry.path);
          await unlink(entry.temporary).catch(() => undefined);
        } catch (error) {
          const code = errorCode(error);
          if (code === "EEXIST") throw exists();
          if (code !== "EPERM" && code !== "ENOTSUP" && code !== "EOPNOTSUPP") throw error;
          // A file system without hard links: check, then rename (not atomic against a racing writer).
          if ((await lstat(entry.path).catch(() => null)) !== null) throw exists();
          await rename(entry.temporary, entry.path);
        }
        placed.push({ path: entry.path, backup: null });
        continue;
      }
      const backup = await keepOld(entry.path);
      try {
        await rename(entry.temporary, entry.path);
      } catch (error) {
        if (backup !== null) await unlink(backup).catch(() => undefined);
        throw error;
      }
      placed.push({ path: entry.path, backup });
    }
  } catch (error) {
    for (const entry of placed.reverse()) {
      if (entry.backup === null) await unlink(entry.path).catch(() => undefined);
      else await rename(entry.backup, entry.path).catch(() => undefined);
    }
    await Promise.all(written.map((entry) => unlink(entry.temporary).catch(() => undefined)));
    if (error instanceof OutputPathError) throw error;
    throw new OutputPathError(current, reasonOf(error, current));
  }
  await Promise.all(placed.map((entry) => (entry.backup === null ? undefined : unlink(entry.backup).catch(() => undefined))));
}

/**
 * Write one file atomically (see {@link writeFilesAtomic}).
 *
 * @param path - target path; its folder must exist.
 * @param data - the contents.
 * @returns when the file is in place.
 * @throws OutputPathError; the target is unchanged and no temporary file remains.
 * @example
 * await writeFileAtomic("out.pdf", bytes);
 */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  await writeFilesAtomic([{ path, data }]);
}
