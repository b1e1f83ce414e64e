import { SignJWT, jwtVerify } from 'jose';
import { config } from '../config';

export const SESSION_COOKIE = 'kinloop_session';

function key(): Uint8Array {
  return new TextEncoder().encode(config().sessionSecret);
}

/** The cookie only carries the signed id of a server-side session row. */
export async function signSessionCookie(sessionId: string, expiresAt: Date): Promise<string> {
  return new SignJWT({})
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(sessionId)
    .setIssuedAt()
    .setExpirationTime(Math.floor(expiresAt.getTime() / 1000))
    .sign(key());
}

export async function readSessionCookie(value: string | undefined): Promise<string | null> {
  if (!value) return null;
  try {
    const { payload } = await jwtVerify(value, key(), { algorithms: ['HS256'] });
    return typeof payload.sub === 'string' ? payload.sub : null;
  } catch {
    return null;
  }
}

export function cookieOptions(expiresAt: Date) {
  return {
    httpOnly: true,
    sameSite: 'lax' as const,
    secure: config().secureCookies,
    path: '/',
    expires: expiresAt,
  };
}
