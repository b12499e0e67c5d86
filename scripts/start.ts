import { buildClient, clientBuildIsStale, ROOT } from './lib/tooling';

// `npm start`: build the client when dist/ is missing or older than its sources, then run the
// server in production mode on the embedded database (demo data on first start).

const root = ROOT;

if (clientBuildIsStale(root)) {
  console.log('Building the web client (vite build)…');
  const status = buildClient(root);
  if (status !== 0) {
    console.error('The client build failed; see the output above.');
    process.exit(status);
  }
}

process.env.NODE_ENV = 'production';
process.chdir(root);
const { runMain } = await import('../server/index');
await runMain();
