// Type augmentations for what the auth layer adds to each request and to the sign-in session.
import type { User as UserRecord } from '../db/models/user.model';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // Passport's req.user is our User model instance.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserRecord {}
    interface Request {
      /** How the caller proved who they are; token callers skip the CSRF guard. */
      authVia?: 'session' | 'token';
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    /** The synchroniser token the CSRF guard compares the x-csrf-token header with. */
    csrfToken?: string;
  }
}

export {};
