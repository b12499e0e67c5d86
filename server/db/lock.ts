import fs from 'node:fs';
import path from 'node:path';

/** Thrown when another live process holds the data directory. */
export class DataDirLockedError extends Error {
  constructor(
    readonly lockPath: string,
    readonly holderPid: number,
  ) {
    super(
      `The data directory is in use by another Spoolwright process (pid ${holderPid}). ` +
        `Stop that process, or point DATA_DIR somewhere else. Lock file: ${lockPath}`,
    );
    this.name = 'DataDirLockedError';
  }
}

export interface DirLock {
  readonly path: string;
  release(): void;
}

function isAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: the process exists but belongs to someone else.
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Take the exclusive lock of a data directory. The embedded database has no lock between
 * processes and two writers silently lose rows, so a second process must refuse to start.
 * The lock file holds the owner's pid; a lock left by a dead process is taken over.
 */
export function acquireDirLock(dir: string, name = 'spoolwright.lock'): DirLock {
  fs.mkdirSync(dir, { recursive: true });
  const lockPath = path.join(dir, name);
  for (let attempt = 0; attempt < 5; attempt++) {
    try {
      const fd = fs.openSync(lockPath, 'wx');
      fs.writeSync(fd, `${process.pid}\n`);
      fs.fsyncSync(fd);
      fs.closeSync(fd);
      let released = false;
      const release = () => {
        if (released) return;
        released = true;
        try {
          if (readPid(lockPath) === process.pid) fs.unlinkSync(lockPath);
        } catch {
          // already gone
        }
      };
      process.once('exit', release);
      return { path: lockPath, release };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
      const holder = readPid(lockPath);
      if (holder === null) {
        // Written by a process that died between create and write, or being written right now.
        const ageMs = Date.now() - statMtime(lockPath);
        if (ageMs < 2000) {
          sleepSync(100);
          continue;
        }
      } else if (holder === process.pid || isAlive(holder)) {
        throw new DataDirLockedError(lockPath, holder);
      }
      // Stale: its owner is gone. Remove and retry; the 'wx' open settles any race.
      try {
        fs.unlinkSync(lockPath);
      } catch {
        // another process removed it first
      }
    }
  }
  throw new Error(`Could not take the data directory lock ${lockPath}`);
}

function readPid(lockPath: string): number | null {
  try {
    const n = Number.parseInt(fs.readFileSync(lockPath, 'utf8').trim(), 10);
    return Number.isInteger(n) && n > 0 ? n : null;
  } catch {
    return null;
  }
}

function statMtime(p: string): number {
  try {
    return fs.statSync(p).mtimeMs;
  } catch {
    return 0;
  }
}

function sleepSync(ms: number) {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}
