import 'express-session';

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  siteAdmin: boolean;
}

declare module 'express-session' {
  interface SessionData {
    userId: string;
    csrfToken: string;
    idToken: string;
    /** Kept between /auth/login and /auth/callback only. */
    login: { codeVerifier: string; state: string; nonce: string; returnTo: string };
  }
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      user?: SessionUser;
    }
  }
}
