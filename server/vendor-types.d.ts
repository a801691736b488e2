// express-mysql-session ships no types; this is the part Causeway uses.
declare module 'express-mysql-session' {
  import type session from 'express-session';
  interface MySQLStoreOptions {
    createDatabaseTable?: boolean;
    clearExpired?: boolean;
    checkExpirationInterval?: number;
    schema?: { tableName: string; columnNames: { session_id: string; expires: string; data: string } };
  }
  type MySQLStoreClass = new (options: MySQLStoreOptions, connection?: unknown) => session.Store & { close(): Promise<void> };
  export default function MySQLStoreFactory(s: typeof session): MySQLStoreClass;
}
