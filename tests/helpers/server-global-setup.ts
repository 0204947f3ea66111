import type { TestProject } from 'vitest/node';
import { prepareTestDatabase } from './db';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}

/** The server project's database: `placewright_test`, emptied and migrated once per run. */
export default async function setup(project: TestProject) {
  const url = await prepareTestDatabase(process.env.PW_TEST_DB_NAME ?? 'placewright_test');
  project.provide('databaseUrl', url);
}
