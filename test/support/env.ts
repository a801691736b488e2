// Test configuration: the same private MariaDB as npm start, a mail catcher on ports of its own.
import { loadConfig, type Config } from '../../server/config';

export const TEST_MAIL = { smtp: 1026, web: 1081 };

export function testConfig(overrides: Record<string, string> = {}): Config {
  return loadConfig({
    ...process.env,
    NODE_ENV: 'test',
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'silent',
    SMTP_PORT: String(TEST_MAIL.smtp),
    MAIL_WEB_PORT: String(TEST_MAIL.web),
    SESSION_SECRET: 'test-secret-that-is-long-enough-to-pass-checks',
    AUTH_LIMIT_PER_ADDRESS: '100000',
    ...overrides,
  });
}
