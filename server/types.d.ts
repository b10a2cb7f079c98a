import type { SessionUser } from '@shared/schemas/auth';

declare global {
  namespace Express {
    interface Request {
      /** Set from the session on every request; null when signed out. */
      user: SessionUser | null;
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    userId: number;
  }
}

export {};
