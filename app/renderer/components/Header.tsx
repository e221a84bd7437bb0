/** The top bar: the app's name, the scenario and its file, and the file commands. */
import { useRef } from 'react';
import iconUrl from '../../../assets/icon.svg';
import type { RecentEntry } from '../services/platform.ts';

export interface HeaderProps {
  title: string;
  fileName: string;
  dirty: boolean;
  nativeDialogs: boolean;
  demos: readonly { id: string; label: string }[];
  recent: readonly RecentEntry[];
  onOpenFile(file: File): void;
  onOpenDialog(): void;
  onOpenRecent(entry: RecentEntry): void;
  onLoadDemo(id: string): void;
  onSave(): void;
  onSaveAs(): void;
}

export function Header(p: HeaderProps) {
  const input = useRef<HTMLInputElement>(null);
  return (
    <header className="top">
      <div className="brand">
        <img src={iconUrl} alt="" width={26} height={26} />
        <span>quietgrid</span>
      </div>
      <div className="doc" title={p.title}>
        <span className="doc-title">{p.title}</span>
        <span className="doc-file">{p.fileName}{p.dirty && <span className="dirty" title="Edited since it was opened or saved; kept in this browser until saved"> · edited</span>}</span>
      </div>
      <nav className="file-commands" aria-label="File">
        <select aria-label="Load a demo scenario" value="" onChange={(e) => { if (e.target.value) p.onLoadDemo(e.target.value); }}>
          <option value="">Demos…</option>
          {p.demos.map((d) => <option key={d.id} value={d.id}>{d.label}</option>)}
        </select>
        {p.nativeDialogs
          ? <button type="button" onClick={p.onOpenDialog}>Open…</button>
          : <>
            <button type="button" onClick={() => input.current?.click()}>Open…</button>
            <input ref={input} type="file" accept=".json,application/json" hidden data-testid="open-file"
              onChange={(e) => { const f = e.target.files?.[0]; if (f) p.onOpenFile(f); e.target.value = ''; }} />
          </>}
        <select aria-label="Open a recent file" value="" disabled={p.recent.length === 0}
          onChange={(e) => { const r = p.recent[Number(e.target.value)]; if (r) p.onOpenRecent(r); }}>
          <option value="">Recent…</option>
          {p.recent.map((r, i) => <option key={`${r.name}-${i}`} value={i}>{r.path ?? r.name}</option>)}
        </select>
        <button type="button" onClick={p.onSave}>{p.nativeDialogs ? 'Save' : 'Download .json'}</button>
        {p.nativeDialogs && <button type="button" onClick={p.onSaveAs}>Save as…</button>}
      </nav>
    </header>
  );
}
