import { spawn, spawnSync } from 'node:child_process';

/** Runs a command to completion; throws with its output when it fails. */
export function run(cmd, args, options = {}) {
  const r = spawnSync(cmd, args, { encoding: 'utf8', cwd: '/', ...options });
  if (r.error) throw r.error;
  if (r.status !== 0 && !options.allowFailure) {
    throw new Error(`${cmd} ${args.join(' ')} exited ${r.status}\n${r.stdout ?? ''}${r.stderr ?? ''}`);
  }
  return r;
}

/** Runs a command with its output shown; resolves with the exit code. */
export function runVisible(cmd, args, options = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: 'inherit', ...options });
    child.on('error', reject);
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

export const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

export function commandExists(cmd) {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { encoding: 'utf8' }).status === 0;
}

let aptUpdated = false;
/** Installs Debian packages when root; otherwise says the one command to run and stops. */
export function aptInstall(packages, why) {
  if (!isRoot()) {
    console.error(`${why}\nPlease run:  sudo apt-get install -y --no-upgrade ${packages.join(' ')}`);
    process.exit(1);
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  console.log(`[loambook] ${why} Installing ${packages.join(', ')} with apt-get …`);
  if (!aptUpdated) {
    run('apt-get', ['update', '-q'], { env, stdio: 'inherit' });
    aptUpdated = true;
  }
  run('apt-get', ['install', '-y', '-q', '--no-upgrade', ...packages], { env, stdio: 'inherit' });
}
