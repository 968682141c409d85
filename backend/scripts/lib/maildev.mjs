// maildev on loopback: the development inbox that catches every e-mail Loambook sends.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { mail, log, REPO, STATE_DIR } from './env.mjs';

const PID_FILE = path.join(STATE_DIR, 'run', 'maildev.pid');

function alive(pid) {
  try {
    process.kill(pid, 0);
    return readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('maildev');
  } catch {
    return false;
  }
}

function portOpen(port) {
  return new Promise((resolve) => {
    const s = net.connect(port, '127.0.0.1');
    s.on('connect', () => (s.destroy(), resolve(true)));
    s.on('error', () => resolve(false));
  });
}

export async function startMaildev() {
  const inbox = `http://127.0.0.1:${mail.webPort}`;
  if (existsSync(PID_FILE) && alive(Number(readFileSync(PID_FILE, 'utf8')))) return inbox;
  if (await portOpen(mail.smtpPort)) {
    log(`Something already listens on SMTP port ${mail.smtpPort}; using it as the mail server`);
    return inbox;
  }
  mkdirSync(path.dirname(PID_FILE), { recursive: true });
  const bin = [REPO, path.join(REPO, 'backend')]
    .map((dir) => path.join(dir, 'node_modules', 'maildev', 'dist', 'bin', 'maildev.js'))
    .find((file) => existsSync(file));
  if (!bin) throw new Error('maildev is not installed: run npm ci');
  const logFd = openSync(path.join(STATE_DIR, 'run', 'maildev.log'), 'a');
  const child = spawn(
    process.execPath,
    [
      bin,
      '-s',
      String(mail.smtpPort),
      '-w',
      String(mail.webPort),
      '--ip',
      '127.0.0.1',
      '--mail-directory',
      path.join(STATE_DIR, 'mail'),
    ],
    { detached: true, stdio: ['ignore', logFd, logFd] },
  );
  child.unref();
  writeFileSync(PID_FILE, String(child.pid));
  for (let i = 0; i < 40 && !(await portOpen(mail.smtpPort)); i++)
    await new Promise((r) => setTimeout(r, 250));
  log(`maildev started (SMTP 127.0.0.1:${mail.smtpPort}, inbox ${inbox})`);
  return inbox;
}

export function stopMaildev() {
  if (!existsSync(PID_FILE)) return;
  const pid = Number(readFileSync(PID_FILE, 'utf8'));
  if (alive(pid)) {
    process.kill(pid, 'SIGTERM');
    log('maildev stopped');
  }
  rmSync(PID_FILE, { force: true });
}
