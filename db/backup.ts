// Backups: a consistent mariadb-dump of the database plus a copy of the attachment files.
import { execFileSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, openSync, closeSync, rmSync, writeFileSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BackupSettings } from './settings';
import { adminSql, localServerPaths } from './local-server';

const client = (config: BackupSettings) => ['--no-defaults', `--socket=${localServerPaths(config).socket}`, `--user=${os.userInfo().username}`];

export interface BackupManifest {
  database: string;
  createdAt: string;
  uploads: boolean;
}

/** Writes <dir>/database.sql, <dir>/uploads/ and <dir>/manifest.json. */
export function backup(config: BackupSettings, dir: string): BackupManifest {
  mkdirSync(dir, { recursive: true });
  const out = openSync(path.join(dir, 'database.sql'), 'w');
  try {
    // --single-transaction: an InnoDB snapshot, so the app keeps running during the dump.
    execFileSync('mariadb-dump', [...client(config), '--single-transaction', '--routines', '--triggers', '--hex-blob', config.db.database], { stdio: ['ignore', out, 'pipe'] });
  } finally {
    closeSync(out);
  }
  const uploads = existsSync(config.uploadDir);
  if (uploads) cpSync(config.uploadDir, path.join(dir, 'uploads'), { recursive: true });
  const manifest = { database: config.db.database, createdAt: new Date().toISOString(), uploads };
  writeFileSync(path.join(dir, 'manifest.json'), JSON.stringify(manifest, null, 2));
  return manifest;
}

/** Replaces the database and the attachment files with those of a backup folder. */
export function restore(config: BackupSettings, dir: string): BackupManifest {
  const manifest = JSON.parse(readFileSync(path.join(dir, 'manifest.json'), 'utf8')) as BackupManifest;
  const db = config.db.database;
  adminSql(config, `DROP DATABASE IF EXISTS \`${db}\`; CREATE DATABASE \`${db}\`;`);
  const input = openSync(path.join(dir, 'database.sql'), 'r');
  try {
    execFileSync('mariadb', [...client(config), db], { stdio: [input, 'ignore', 'pipe'] });
  } finally {
    closeSync(input);
  }
  rmSync(config.uploadDir, { recursive: true, force: true });
  if (manifest.uploads && existsSync(path.join(dir, 'uploads'))) cpSync(path.join(dir, 'uploads'), config.uploadDir, { recursive: true });
  return manifest;
}
