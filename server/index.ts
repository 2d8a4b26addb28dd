import { openDb } from '@/db';

import { createApp } from './app';
import { readConfig } from './config';

const config = readConfig();
const db = openDb(config.databasePath);
const app = createApp({ db, baseURL: config.baseURL, secret: config.secret, webDir: config.webDir });

const server = app.listen(config.port, () => {
  console.log(`Lobewright is serving ${config.baseURL} (database ${config.databasePath})`);
});

function shutdown() {
  server.close(() => {
    db.$client.close();
    process.exit(0);
  });
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
