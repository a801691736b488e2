import type { SessionUser } from './auth/session-user';

declare global {
  namespace Express {
    // passport's req.user
    interface User extends SessionUser {}
    interface Request {
      valid?: { body?: unknown; query?: unknown; params?: unknown };
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    signedInAt?: number;
    csrfToken?: string;
  }
}

export {};
