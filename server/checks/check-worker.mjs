// Worker-thread entry of the check pool. The server runs TypeScript through tsx, in development
// and in production alike; a worker thread does not inherit the parent's loader hooks in every
// setting (vitest, plain node), so it registers tsx itself and then loads the TypeScript task.
import Piscina from 'piscina';
import { register } from 'tsx/esm/api';

register();
const { runCheckTask } = await import('./check-task.ts');

/** JSON results travel back as bytes moved (not copied) to the main thread. */
export default async function run(task) {
  const answer = await runCheckTask(task);
  // (Only a top-level value can be moved; gzip'd checks are small enough to copy.)
  return answer.kind === 'json' ? Piscina.move(answer.bytes) : answer;
}
