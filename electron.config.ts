/**
 * Packaging configuration for the desktop app (electron-builder 26, which reads a .ts config through jiti).
 * Run: `npm run build && npx electron-builder --config electron.config.ts` (the file name is not
 * auto-discovered, so --config is needed). Packaging downloads the Electron binary from outside the npm
 * registry, so it cannot run offline, here or in CI (stack.md §3); docs/demo-and-shell.md says more.
 */
import type { Configuration } from 'electron-builder';

const config: Configuration = {
  appId: 'org.dipweave.desktop',
  productName: 'Dipweave',
  copyright: 'Dipweave contributors',
  directories: { output: 'release', buildResources: 'build-resources' },
  // Only what runs: the bundled main/preload, the built renderer, the demo files. Vite has already bundled
  // every library into dist/renderer, so no node_modules are needed in the package.
  files: ['package.json', 'dist-electron/**/*.cjs', 'dist/renderer/**/*', 'samples/*.sgy', 'samples/README.md', '!**/*.map'],
  extraMetadata: { main: 'dist-electron/main.cjs' },
  asar: true,
  // The demo files are read with ordinary fs calls from the main process; keep them outside the archive.
  asarUnpack: ['samples/**'],
  npmRebuild: false,
  electronLanguages: ['en-US'],
  fileAssociations: [{ ext: ['sgy', 'segy'], name: 'SEG-Y gather file', role: 'Viewer' }],
  linux: { target: ['AppImage', 'deb'], category: 'Science', maintainer: 'Dipweave contributors' },
  win: { target: ['nsis'] },
  nsis: { oneClick: false, perMachine: false, allowToChangeInstallationDirectory: true },
  mac: { target: ['dmg'], category: 'public.app-category.education', hardenedRuntime: true },
};

export default config;
