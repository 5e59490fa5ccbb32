// `npm run dev`: the same database and API server as `npm start`, plus Vite's
// dev server with hot reload, proxying /api and /auth to the API server.
import { runCrosswatt } from './lib/run-crosswatt';

const vitePort = Number(process.env.VITE_PORT ?? 5173);
process.env.API_PORT = process.env.PORT ?? '3000';

runCrosswatt({
  publicUrl: `http://127.0.0.1:${vitePort}`,
  async afterStart() {
    const { createServer } = await import('vite');
    const before = { sigterm: new Set(process.listeners('SIGTERM')), stdinEnd: new Set(process.stdin.listeners('end')) };
    const vite = await createServer({ server: { port: vitePort, strictPort: true } });
    // Vite exits the process on SIGTERM (and when stdin closes) by itself; our own
    // shutdown must run instead: it closes Vite and then stops PostgreSQL.
    for (const listener of process.listeners('SIGTERM')) if (!before.sigterm.has(listener)) process.off('SIGTERM', listener);
    for (const listener of process.stdin.listeners('end'))
      if (!before.stdinEnd.has(listener)) process.stdin.off('end', listener as () => void);
    await vite.listen();
    return () => vite.close();
  },
});
