/** The absolute address that links in e-mails start with. */
import type { Request } from 'express';
import type { Env } from '../env';

/**
 * The base of absolute links in e-mails, without a trailing slash: PUBLIC_ORIGIN when it is set (a deployment should
 * set it); otherwise the address the request came to (scheme and Host, honouring TRUST_PROXY through Express); with
 * no request, `http://localhost:<PORT>`.
 * @param env - the parsed environment
 * @param req - the request that causes the mail, when there is one
 */
export function linkBase(env: Pick<Env, 'PUBLIC_ORIGIN' | 'PORT'>, req?: Pick<Request, 'protocol' | 'get'>): string {
  if (env.PUBLIC_ORIGIN) return env.PUBLIC_ORIGIN.replace(/\/+$/, '');
  const host = req?.get('host');
  if (req && host && /^[A-Za-z0-9.:[\]-]+$/.test(host)) return `${req.protocol}://${host}`;
  return `http://localhost:${env.PORT}`;
}
