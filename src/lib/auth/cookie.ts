import { randomUUID } from 'node:crypto';
import type { AstroCookies } from 'astro';
import { SignJWT, jwtVerify } from 'jose';
import { config } from '../config';
import type { AuthSessionRow } from '../db/tables';

export const SESSION_COOKIE = 'kinloop_session';
/** Marks a browser where an account signed in before, so that the sign-in slowdown of that account does not apply to it. */
export const DEVICE_COOKIE = 'kinloop_device';
const DEVICE_DAYS = 180;

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
    // A device cookie (audience "device") is signed with the same key and is never a session.
    return typeof payload.sub === 'string' && payload.aud === undefined ? payload.sub : null;
  } catch {
    return null;
  }
}

export interface TrustedDevice {
  userId: string;
  deviceId: string;
}

/** The account and device a trusted-device cookie names, or null when it is missing, forged or expired. */
export async function readDeviceCookie(value: string | undefined): Promise<TrustedDevice | null> {
  if (!value) return null;
  try {
    const { payload } = await jwtVerify(value, key(), { algorithms: ['HS256'], audience: 'device' });
    return typeof payload.sub === 'string' && typeof payload.jti === 'string' ? { userId: payload.sub, deviceId: payload.jti } : null;
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

/**
 * After a sign-in (password, invitation or reset link): the session cookie,
 * and the trusted-device cookie for this account (the same device id when the
 * browser already had one for it).
 */
export async function setSignedInCookies(cookies: AstroCookies, userId: string, session: AuthSessionRow, device: TrustedDevice | null): Promise<void> {
  cookies.set(SESSION_COOKIE, await signSessionCookie(session.id, session.expires_at), cookieOptions(session.expires_at));
  const deviceId = device?.userId === userId ? device.deviceId : randomUUID();
  const expires = new Date(Date.now() + DEVICE_DAYS * 86_400_000);
  const token = await new SignJWT({})
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(userId)
    .setJti(deviceId)
    .setAudience('device')
    .setIssuedAt()
    .setExpirationTime(Math.floor(expires.getTime() / 1000))
    .sign(key());
  cookies.set(DEVICE_COOKIE, token, cookieOptions(expires));
}
