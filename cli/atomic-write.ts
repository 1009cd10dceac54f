/**
 * Output files appear whole or not at all, and never in place of the input.
 * A run killed while writing leaves at most a hidden temporary file beside the
 * target (".NAME.PID.RANDOM.tmp"), never an empty or half-written workbook
 * that a later run would refuse to replace.
 */
import { randomBytes } from "node:crypto";
import { open, realpath, rename, rm, stat } from "node:fs/promises";
import { basename, dirname, join, resolve } from "node:path";

/** Writes bytes to a temporary file in the target's folder, flushes it, then renames it over the target. */
export async function writeAtomically(path: string, bytes: Uint8Array): Promise<void> {
  const target = resolve(path);
  const temporary = join(dirname(target), `.${basename(target)}.${process.pid}.${randomBytes(4).toString("hex")}.tmp`);
  const handle = await open(temporary, "wx");
  try {
    try {
      await handle.writeFile(bytes);
      await handle.sync();
    } finally {
      await handle.close();
    }
    // rename() replaces a symbolic link at the target by the file, never the file the link points to.
    await rename(temporary, target);
  } catch (error) {
    await rm(temporary, { force: true });
    throw error;
  }
}

/**
 * True when writing to output would replace the input: the same path after
 * resolving symbolic links, or the same file under another name (a hard link:
 * same device and inode).
 */
export async function isSameFile(input: string, output: string): Promise<boolean> {
  const inputReal = await realpath(input).catch(() => resolve(input));
  const outputReal = await realpath(output).catch(async () => join(await realpath(dirname(resolve(output))).catch(() => dirname(resolve(output))), basename(output)));
  if (inputReal === outputReal) return true;
  const [a, b] = await Promise.all([stat(input).catch(() => undefined), stat(output).catch(() => undefined)]);
  return a !== undefined && b !== undefined && a.dev === b.dev && a.ino === b.ino;
}
