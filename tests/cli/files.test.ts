import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { FileTooLargeError, readTextFile, writeFileAtomic, writeFileAtomicIn } from '../../engine/node/files.ts';

let tmp: string;
beforeAll(() => { tmp = mkdtempSync(join(tmpdir(), 'quietgrid-files-')); });
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe('writeFileAtomic', () => {
  it('replaces a file whole and leaves no temporary file behind', async () => {
    const path = join(tmp, 'a.csv');
    writeFileSync(path, 'old');
    await writeFileAtomic(path, 'new contents');
    expect(readFileSync(path, 'utf8')).toBe('new contents');
    expect(readdirSync(tmp)).toEqual(['a.csv']);
  });

  it('on failure keeps the old target and removes its temporary file', async () => {
    const path = join(tmp, 'occupied');
    mkdirSync(join(path, 'inside'), { recursive: true });
    await expect(writeFileAtomic(path, 'x')).rejects.toThrow();
    expect(readdirSync(path)).toEqual(['inside']);
    expect(readdirSync(tmp).filter((f) => f.includes('.tmp-'))).toEqual([]);
  });

  it('creates the folder with writeFileAtomicIn', async () => {
    await writeFileAtomicIn(join(tmp, 'deep', 'er', 'b.json'), '{}');
    expect(readFileSync(join(tmp, 'deep', 'er', 'b.json'), 'utf8')).toBe('{}');
  });
});

describe('readTextFile', () => {
  it('reads UTF-8 text and refuses a file larger than the limit before reading it', async () => {
    const path = join(tmp, 'c.txt');
    writeFileSync(path, 'µPa');
    expect(await readTextFile(path, 100)).toBe('µPa');
    await expect(readTextFile(path, 3)).rejects.toBeInstanceOf(FileTooLargeError);
    await expect(readTextFile(tmp, 100)).rejects.toThrow(/not a regular file/);
  });
});
