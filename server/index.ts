// Server entry: validate configuration, boot, listen.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { boot } from './boot';
import { ConfigError, loadConfig } from './config';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

try {
  const config = loadConfig();
  const clientDir = process.env.VARSMITH_NO_CLIENT === '1' ? undefined : path.join(root, 'dist');
  const booted = await boot(config, { clientDir });
  const server = booted.app.listen(config.port, config.host, () => {
    const address = server.address();
    const port = typeof address === 'object' && address ? address.port : config.port;
    process.stdout.write(`Varsmith listening on http://localhost:${port} (database ${config.databaseUrl ? 'PostgreSQL' : config.databasePath}${booted.seeded ? ', demo data seeded' : ''}${booted.ctx.mailer.localPort ? `, local mail capture on 127.0.0.1:${booted.ctx.mailer.localPort}` : ''})\n`);
  });
  const stop = () => { server.close(() => { void booted.close().then(() => process.exit(0)); }); };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
} catch (err) {
  process.stderr.write(`${err instanceof ConfigError ? err.message : (err as Error).stack ?? String(err)}\n`);
  process.exit(1);
}
