// `npm run dev`: the same database and API server as `npm start`, plus Vite's
// dev server with hot reload, proxying /api and /auth to the API server.
import { runCrosswatt } from './lib/run-crosswatt';

const vitePort = Number(process.env.VITE_PORT ?? 5173);
process.env.API_PORT = process.env.PORT ?? '3000';

runCrosswatt({
  publicUrl: `http://127.0.0.1:${vitePort}`,
  async afterStart() {
    const { createServer } = await import('vite');
    const vite = await createServer({ server: { port: vitePort, strictPort: true } });
    await vite.listen();
    return () => vite.close();
  },
});
