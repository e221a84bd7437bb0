/**
 * Files for the command line: writes that never leave a half-written result behind, and reads that
 * refuse a file too large to be what it claims before loading it.
 */
import { open, rename, unlink, mkdir } from 'node:fs/promises';
import { dirname } from 'node:path';

let written = 0;

/**
 * Writes `data` to `path` through a temporary file in the same folder, flushed to disk, then renamed
 * over `path`: rename within one file system is atomic (POSIX rename(2)), so a reader sees the old
 * file or the new one, never a partial one, even if the program is stopped mid-write.
 */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const tmp = `${path}.tmp-${process.pid}-${written++}`;
  try {
    const fh = await open(tmp, 'w');
    try {
      await fh.writeFile(data);
      await fh.sync();
    } finally {
      await fh.close();
    }
    await rename(tmp, path);
  } catch (e) {
    await unlink(tmp).catch(() => undefined);
    throw e;
  }
}

/** writeFileAtomic after creating the folder it goes in. */
export async function writeFileAtomicIn(path: string, data: string | Uint8Array): Promise<void> {
  await mkdir(dirname(path), { recursive: true });
  await writeFileAtomic(path, data);
}

export class FileTooLargeError extends Error {
  constructor(readonly path: string, readonly bytes: number, readonly maxBytes: number) {
    super(`${path} is ${bytes} bytes, more than the ${maxBytes} bytes accepted for this kind of file`);
    this.name = 'FileTooLargeError';
  }
}

/** A UTF-8 text file, refused with FileTooLargeError when larger than `maxBytes` (checked before reading). */
export async function readTextFile(path: string, maxBytes: number): Promise<string> {
  const fh = await open(path, 'r');
  try {
    const { size, isFile } = await fh.stat().then((s) => ({ size: s.size, isFile: s.isFile() }));
    if (!isFile) throw Object.assign(new Error(`${path} is not a regular file`), { code: 'ENOTFILE' });
    if (size > maxBytes) throw new FileTooLargeError(path, size, maxBytes);
    return await fh.readFile({ encoding: 'utf8' });
  } finally {
    await fh.close();
  }
}

/** A file-system error in words for a user: what went wrong with which path. */
export function describeFileError(e: unknown, path: string): string {
  if (e instanceof FileTooLargeError) return e.message;
  const code = (e as { code?: string } | null)?.code;
  switch (code) {
    case 'ENOENT': return `${path}: no such file`;
    case 'EACCES': case 'EPERM': return `${path}: permission denied`;
    case 'EISDIR': case 'ENOTFILE': return `${path} is a folder or special file, not a regular file`;
    default: return `${path}: ${e instanceof Error ? e.message : String(e)}`;
  }
}
