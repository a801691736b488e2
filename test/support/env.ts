// Test configuration: the same private MariaDB as npm start, a mail catcher on ports of its own.
import { loadConfig, type Config } from '../../server/config';

// Several checkouts on one machine can run their suites at once: each sets its own offset.
export const TEST_PORT_OFFSET = Number(process.env.CAUSEWAY_TEST_PORT_OFFSET ?? 0);

export const TEST_MAIL = { smtp: 1026 + TEST_PORT_OFFSET, web: 1081 + TEST_PORT_OFFSET };
export const E2E_PORT = 8099 + TEST_PORT_OFFSET;

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
