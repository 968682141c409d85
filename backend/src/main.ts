import path from 'node:path';
import { loadConfig } from './config/config';
import { createApp } from './app.factory';

async function main(): Promise<void> {
  const config = loadConfig({
    FRONTEND_DIST: path.resolve(__dirname, '../../../../frontend/dist'),
    ...process.env,
  });
  const app = await createApp(config);
  app.enableShutdownHooks();
  await app.listen(config.port, config.host);
  console.log(`Loambook is running at ${config.publicUrl}  (API docs: ${config.publicUrl}/api/docs)`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
