/** Runs the headless commands as processes (through tsx) and writes their input files. */
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const ROOT = join(import.meta.dirname, '..', '..');
const TSX = join(ROOT, 'node_modules', '.bin', 'tsx');

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

/** A runner for `shared/cli/<name>.ts`: its exit code and output, with optional standard input. */
export function cliRunner(name: 'check' | 'shop', timeout = 30_000) {
  const cli = join(ROOT, 'shared', 'cli', `${name}.ts`);
  return (args: string[], stdin?: string): Promise<CliRun> =>
    new Promise((resolve) => {
      const child = execFile(TSX, [cli, ...args], { cwd: ROOT, timeout }, (err, stdout, stderr) => {
        const code =
          err && typeof (err as { code?: unknown }).code === 'number'
            ? (err as { code: number }).code
            : 0;
        resolve({ code, stdout, stderr });
      });
      if (stdin !== undefined) child.stdin?.end(stdin);
    });
}

/** A fresh temporary folder for a test file's inputs and outputs. */
export const tempDir = (prefix: string): string => mkdtempSync(join(tmpdir(), prefix));

/** Writes input files into `dir`; a string is written as is, anything else as JSON. */
export function fileWriter(dir: string) {
  return (name: string, data: unknown): string => {
    const p = join(dir, name);
    writeFileSync(p, typeof data === 'string' ? data : JSON.stringify(data));
    return p;
  };
}
