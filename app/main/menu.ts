/** The application menu: file commands, the run, and the screens, each sent to the renderer as a command. */
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand } from '../shared/bridge.ts';

export function menuTemplate(send: (c: MenuCommand) => void, isMac: boolean): MenuItemConstructorOptions[] {
  const cmd = (label: string, command: MenuCommand, accelerator?: string): MenuItemConstructorOptions => ({ label, accelerator, click: () => send(command) });
  return [
    ...(isMac ? [{ role: 'appMenu' }] : []),
    {
      label: 'File',
      submenu: [
        cmd('Open scenario…', 'open', 'CmdOrCtrl+O'),
        cmd('Save', 'save', 'CmdOrCtrl+S'),
        cmd('Save as…', 'save-as', 'CmdOrCtrl+Shift+S'),
        { type: 'separator' },
        cmd('Export spectrum CSV…', 'export-spectrum'),
        cmd('Export bands CSV…', 'export-bands'),
        { type: 'separator' },
        { role: isMac ? 'close' : 'quit' },
      ],
    },
    { label: 'Edit', submenu: [{ role: 'undo' }, { role: 'redo' }, { type: 'separator' }, { role: 'cut' }, { role: 'copy' }, { role: 'paste' }, { role: 'selectAll' }] },
    {
      label: 'Run',
      submenu: [cmd('Run sweep', 'run', 'CmdOrCtrl+R'), cmd('Cancel run', 'cancel', 'CmdOrCtrl+.')],
    },
    {
      label: 'View',
      submenu: [
        cmd('Sketch', 'tab-sketch', 'CmdOrCtrl+1'), cmd('Sweep & mesh', 'tab-sweep', 'CmdOrCtrl+2'),
        cmd('Results', 'tab-results', 'CmdOrCtrl+3'), cmd('Field slices', 'tab-field', 'CmdOrCtrl+4'),
        { type: 'separator' }, { role: 'resetZoom' }, { role: 'zoomIn' }, { role: 'zoomOut' }, { role: 'togglefullscreen' },
      ],
    },
  ];
}
