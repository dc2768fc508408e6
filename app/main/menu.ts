/**
 * Dipweave's application menu, as data. The menu only sends commands to the renderer (which owns the
 * workflow) except "Open recent", which the main process opens itself because the path is already trusted.
 */
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand, RecentFile } from '../shared/ipc';

export interface MenuActions {
  send: (command: MenuCommand) => void;
  openRecent: (path: string) => void;
  quit: () => void;
}

export function buildMenuTemplate(recent: readonly RecentFile[], actions: MenuActions, isMac: boolean): MenuItemConstructorOptions[] {
  const recentItems: MenuItemConstructorOptions[] = recent.length
    ? recent.map((r) => ({ label: r.name, sublabel: r.path, click: () => actions.openRecent(r.path) }))
    : [{ label: 'No recent files', enabled: false }];
  const file: MenuItemConstructorOptions = {
    label: '&File',
    submenu: [
      { label: 'Open Gather File…', accelerator: 'CmdOrCtrl+O', click: () => actions.send({ type: 'open' }) },
      { label: 'Open Recent', submenu: recentItems },
      { label: 'Open Demo Line', click: () => actions.send({ type: 'open-demo' }) },
      { type: 'separator' },
      { label: 'Export Filled Gather as SEG-Y…', accelerator: 'CmdOrCtrl+E', click: () => actions.send({ type: 'export-gather' }) },
      { label: 'Export All Gathers as SEG-Y…', click: () => actions.send({ type: 'export-all-gathers' }) },
      { label: 'Export Slope Field…', click: () => actions.send({ type: 'export-slopes' }) },
      { label: 'Export View as PNG…', click: () => actions.send({ type: 'export-image' }) },
      { label: 'Save Recipe…', accelerator: 'CmdOrCtrl+S', click: () => actions.send({ type: 'save-recipe' }) },
      { type: 'separator' },
      { label: isMac ? 'Quit Dipweave' : 'E&xit', accelerator: 'CmdOrCtrl+Q', click: () => actions.quit() },
    ],
  };
  const help: MenuItemConstructorOptions = {
    label: '&Help',
    submenu: [{ label: 'About Dipweave and Its Cautions', click: () => actions.send({ type: 'about' }) }],
  };
  const view: MenuItemConstructorOptions = {
    label: '&View',
    submenu: [{ role: 'resetZoom' }, { role: 'zoomIn' }, { role: 'zoomOut' }, { type: 'separator' }, { role: 'togglefullscreen' }],
  };
  // Text fields need the clipboard; undo/redo of dip edits is the renderer's own (Ctrl+Z, Ctrl+Shift+Z).
  const edit: MenuItemConstructorOptions = { label: '&Edit', submenu: [{ role: 'cut' }, { role: 'copy' }, { role: 'paste' }, { role: 'selectAll' }] };
  return [file, edit, view, help];
}
