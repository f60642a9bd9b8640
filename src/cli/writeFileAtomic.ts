/**
 * Writing output files so that a reader never sees a half-written file and a failure leaves
 * nothing behind: each file is written to a temporary name in its own folder, flushed to disk,
 * and renamed over the target (rename within one folder is atomic on POSIX file systems).
 */
import { randomBytes } from "node:crypto";
import { open, rename, unlink } from "node:fs/promises";
import { basename, dirname, join } from "node:path";

/** One file to write. */
export interface FileToWrite {
  readonly path: string;
  readonly data: string | Uint8Array;
}

function temporaryPath(path: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(6).toString("hex")}.tmp`);
}

async function writeTemporary(file: FileToWrite): Promise<string> {
  const temporary = temporaryPath(file.path);
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
 * Write several files all-or-nothing as far as the file system allows: every file goes to a
 * temporary name beside its target first; only when all are written are they renamed into
 * place. A failure while writing removes every temporary file and leaves the targets untouched.
 *
 * @param files - paths (relative to the working folder or absolute) and contents.
 * @returns when every file is in place.
 * @throws the file-system error (ENOENT for a missing folder, EACCES, ENOSPC …); no temporary file remains.
 * @example
 * await writeFilesAtomic([{ path: "briefing.pdf", data: pdfBytes }, { path: "briefing.html", data: html }]);
 */
export async function writeFilesAtomic(files: readonly FileToWrite[]): Promise<void> {
  const written: { temporary: string; path: string }[] = [];
  try {
    for (const file of files) written.push({ temporary: await writeTemporary(file), path: file.path });
    for (const entry of written) await rename(entry.temporary, entry.path);
  } catch (error) {
    await Promise.all(written.map((entry) => unlink(entry.temporary).catch(() => undefined)));
    throw error;
  }
}

/**
 * Write one file atomically (see {@link writeFilesAtomic}).
 *
 * @param path - target path; its folder must exist.
 * @param data - the contents.
 * @returns when the file is in place.
 * @throws the file-system error; the target is unchanged and no temporary file remains.
 * @example
 * await writeFileAtomic("out.pdf", bytes);
 */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  await writeFilesAtomic([{ path, data }]);
}
