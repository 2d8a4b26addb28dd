import { readConfig } from '@/server/config';

import { openDb } from './index';

// Opening the database applies every migration in drizzle/.
const { databasePath } = readConfig();
openDb(databasePath).$client.close();
console.log(`Migrations applied to ${databasePath}.`);
