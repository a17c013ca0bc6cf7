import type { Express } from 'express';
import { createApp } from '../../server/app.js';
import { readConfig, type ServerConfig } from '../../server/config.js';
import type { DatabaseHandle } from '../../server/db/database.js';
import { testDatabase } from './test-database.js';

/** The real app in-process, on the test database, quiet unless LOG_LEVEL says otherwise. */
export async function testApp(overrides: Partial<ServerConfig> = {}, database?: DatabaseHandle): Promise<Express> {
  const config = { ...readConfig({ LOG_LEVEL: process.env['LOG_LEVEL'] ?? 'silent' }), ...overrides };
  return createApp(config, database ?? (await testDatabase()));
}
