// What db/ needs to know about the configuration. server/config.ts builds a Config that has
// these shapes; db/ depends on them, never on server/.

export interface DbSettings {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
}

/** The private MariaDB of npm start and the tests: its files live under dataDir. */
export interface LocalDbSettings {
  dataDir: string;
  db: DbSettings;
}

/** Backups carry the attachment files beside the dump. */
export interface BackupSettings extends LocalDbSettings {
  uploadDir: string;
}
