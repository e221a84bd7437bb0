/**
 * The recent files main remembers (paths), kept in the user-data folder and written atomically. The
 * renderer may reopen only a path on this list: it cannot ask main to read an arbitrary file.
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { writeFileAtomicIn } from '../../engine/node/files.ts';
import type { RecentFile } from '../shared/bridge.ts';

const MAX_RECENT = 10;

export class RecentList {
  private items: RecentFile[] = [];
  constructor(private readonly file: string) {}

  async load(): Promise<void> {
    try {
      const v = JSON.parse(await readFile(this.file, 'utf8')) as unknown;
      this.items = Array.isArray(v) ? v.filter((r): r is RecentFile => !!r && typeof r.path === 'string' && typeof r.name === 'string').slice(0, MAX_RECENT) : [];
    } catch {
      this.items = [];
    }
  }

  list(): RecentFile[] {
    return this.items.map((r) => ({ ...r }));
  }

  has(path: string): boolean {
    return this.items.some((r) => r.path === path);
  }

  async add(path: string): Promise<RecentFile> {
    const entry = { name: basename(path), path };
    this.items = [entry, ...this.items.filter((r) => r.path !== path)].slice(0, MAX_RECENT);
    await writeFileAtomicIn(this.file, `${JSON.stringify(this.items, null, 2)}\n`);
    return entry;
  }
}
