/**
 * The Electron shell: one window on Provision's own page, a native menu (File → Open store…, Open
 * recent, New store…), and the IPC wiring to the service host. Secure defaults: context isolation,
 * no Node in the page, sandbox, a strict Content-Security-Policy on every response of the app://
 * protocol, navigation and new windows blocked, every permission denied, no remote content.
 *
 * The store lives in a separate service host process (transport/service-host): a plain Node child
 * in development, so better-sqlite3 stays built for Node and `npm test` keeps working after
 * `npm start`; Electron's utility process when packaged, with the module rebuilt for Electron by
 * electron-builder at packaging time only.
 */
import { fork } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join, normalize, sep } from 'node:path';
import {
  app,
  BrowserWindow,
  dialog,
  ipcMain,
  Menu,
  type MenuItemConstructorOptions,
  protocol,
  session,
  utilityProcess,
} from 'electron';
import { contentTypeOf } from './transport/content-type';
import { connectHost, type HostClient } from './transport/host-client';
import type { HostChannel } from './transport/host-protocol';
import { SCREEN_CSP } from './transport/http';
import { APP_ORIGIN, handleIpcCall, IPC_CHANNEL, isOwnPage } from './transport/ipc';
import { readRecent, rememberStore } from './transport/recent-stores';

const ROOT = app.getAppPath();
const RENDERER = join(ROOT, 'dist-renderer');
const RECENT_FILE = () => join(app.getPath('userData'), 'recent-stores.json');

let win: BrowserWindow | null = null;
let host: HostClient | null = null;

protocol.registerSchemesAsPrivileged([
  { scheme: 'app', privileges: { standard: true, secure: true, supportFetchAPI: true, corsEnabled: false } },
]);

/** Start the service host on a store: a Node child in development, a utility process when packaged. */
function startHostProcess(storePath: string, buildDemo: boolean): HostChannel {
  const args = ['--store', storePath, ...(buildDemo ? ['--build-demo'] : [])];
  if (app.isPackaged) {
    const child = utilityProcess.fork(join(ROOT, 'dist-app', 'service-host.mjs'), args, {
      stdio: 'inherit',
      serviceName: 'Provision store',
    });
    return {
      send: (m) => child.postMessage(m),
      onMessage: (l) => child.on('message', l),
      onExit: (l) => child.on('exit', (code) => l(code)),
      kill: () => child.kill(),
    };
  }
  const child = fork(join(ROOT, 'dist-app', 'service-host.mjs'), args, {
    execPath: process.env.PROVISION_NODE || 'node',
    execArgv: [],
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    env: { ...process.env, ELECTRON_RUN_AS_NODE: undefined },
  });
  return {
    send: (m) => child.send(m as never),
    onMessage: (l) => child.on('message', l),
    onExit: (l) => child.on('exit', (code) => l(code)),
    kill: () => child.kill(),
  };
}

async function openStorePath(storePath: string, buildDemo = false): Promise<void> {
  const previous = host;
  host = null;
  await previous?.close();
  try {
    // Building the demo store on first start takes a few seconds: allow for it.
    host = await connectHost(startHostProcess(storePath, buildDemo), storePath, buildDemo ? 180_000 : 60_000);
    rememberStore(RECENT_FILE(), storePath);
    buildMenu();
    win?.setTitle(`Provision — ${storePath}`);
    win?.webContents.reload();
  } catch (err) {
    dialog.showErrorBox('Cannot open the store', err instanceof Error ? err.message : String(err));
  }
}

async function chooseStore(create: boolean): Promise<void> {
  if (!win) return;
  const filters = [{ name: 'Provision store', extensions: ['sqlite'] }];
  if (create) {
    const r = await dialog.showSaveDialog(win, {
      title: 'New store',
      filters,
      defaultPath: 'planning.sqlite',
    });
    if (!r.canceled && r.filePath) await openStorePath(r.filePath);
  } else {
    const r = await dialog.showOpenDialog(win, { title: 'Open store', filters, properties: ['openFile'] });
    if (!r.canceled && r.filePaths[0]) await openStorePath(r.filePaths[0]);
  }
}

function buildMenu(): void {
  const recent = readRecent(RECENT_FILE());
  const template: MenuItemConstructorOptions[] = [
    {
      label: 'File',
      submenu: [
        { label: 'Open store…', accelerator: 'CmdOrCtrl+O', click: () => void chooseStore(false) },
        { label: 'New store…', accelerator: 'CmdOrCtrl+N', click: () => void chooseStore(true) },
        {
          label: 'Open recent',
          submenu:
            recent.length > 0
              ? recent.map((p) => ({ label: p, click: () => void openStorePath(p) }))
              : [{ label: 'No recent stores', enabled: false }],
        },
        { type: 'separator' },
        { role: 'quit' },
      ],
    },
    { role: 'editMenu' },
    {
      label: 'View',
      submenu: [
        { role: 'reload' },
        { role: 'resetZoom' },
        { role: 'zoomIn' },
        { role: 'zoomOut' },
        { role: 'togglefullscreen' },
      ],
    },
    { role: 'windowMenu' },
  ];
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
}

/** Serve dist-renderer under app://provision/ with the CSP on every response; nothing else exists. */
function serveScreens(): void {
  protocol.handle('app', async (request) => {
    const url = new URL(request.url);
    if (url.host !== 'provision') return new Response('not found', { status: 404 });
    let rel = decodeURIComponent(url.pathname);
    if (rel === '/' || rel === '') rel = '/index.html';
    const file = normalize(join(RENDERER, rel));
    if (!file.startsWith(RENDERER + sep) || !existsSync(file))
      return new Response('not found', { status: 404 });
    return new Response(readFileSync(file), {
      headers: {
        'content-type': contentTypeOf(file),
        'content-security-policy': SCREEN_CSP,
        'x-content-type-options': 'nosniff',
      },
    });
  });
}

function lockDown(): void {
  const s = session.defaultSession;
  s.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));
  s.setPermissionCheckHandler(() => false);
  // Only our own protocol (and devtools) may load anything.
  s.webRequest.onBeforeRequest((details, callback) => {
    const ok = details.url.startsWith(`${APP_ORIGIN}/`) || details.url.startsWith('devtools://');
    callback({ cancel: !ok });
  });
  app.on('web-contents-created', (_e, contents) => {
    contents.on('will-navigate', (event, url) => {
      if (!isOwnPage(url)) event.preventDefault();
    });
    contents.on('will-redirect', (event, url) => {
      if (!isOwnPage(url)) event.preventDefault();
    });
    contents.setWindowOpenHandler(() => ({ action: 'deny' }));
    contents.on('will-attach-webview', (event) => event.preventDefault());
  });
}

function createWindow(): void {
  win = new BrowserWindow({
    width: 1440,
    height: 900,
    title: 'Provision',
    show: false,
    webPreferences: {
      preload: join(ROOT, 'dist-app', 'preload.cjs'),
      contextIsolation: true,
      nodeIntegration: false,
      sandbox: true,
      webSecurity: true,
      allowRunningInsecureContent: false,
      spellcheck: false,
    },
  });
  win.once('ready-to-show', () => win?.show());
  win.on('closed', () => {
    win = null;
  });
  void win.loadURL(`${APP_ORIGIN}/index.html#/items`);
}

app.whenReady().then(async () => {
  lockDown();
  serveScreens();
  ipcMain.handle(IPC_CHANNEL, (event, method: unknown, args: unknown) =>
    handleIpcCall(host, event.senderFrame?.url ?? '', method, args),
  );
  buildMenu();
  createWindow();
  // First start: the demo store (built when missing); later starts: the store last opened.
  const chosen = process.env.PROVISION_STORE || readRecent(RECENT_FILE())[0];
  if (chosen) await openStorePath(chosen);
  else
    await openStorePath(
      process.env.PROVISION_DEMO_STORE || join(app.getPath('userData'), 'demo.sqlite'),
      true,
    );
});

app.on('window-all-closed', async () => {
  await host?.close();
  app.quit();
});
