import { Logger } from '@nestjs/common';
import { createApp } from './app.factory.js';
import { loadEnv } from './config/env.js';

async function main(): Promise<void> {
  const env = loadEnv();
  const app = await createApp(env);
  app.enableShutdownHooks();
  await app.listen(env.PORT, '0.0.0.0');
  new Logger('Stavemark').log(`Listening on http://localhost:${env.PORT} (API under /api, docs at /api/docs)`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
