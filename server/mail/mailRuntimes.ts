/** Which process delivers mail: the running mail parts per app context (set by `startMail`). */
import type { FakeSmtpServer } from './FakeSmtpServer';
import type { MailSender } from './MailSender';

/** The mail parts running for one app context. */
export interface MailRuntime {
  /** The fake server, when the app runs its own. */
  smtp: FakeSmtpServer | null;
  sender: MailSender;
  /** Where mail is delivered. */
  port: number;
}

const runtimes = new WeakMap<object, MailRuntime>();

/** The running mail parts of an app, if this process started mail. @param ctx - the app context */
export function mailRuntime(ctx: object): MailRuntime | undefined {
  return runtimes.get(ctx);
}

/**
 * Records (or with undefined, forgets) the mail parts of an app.
 * @param ctx - the app context
 * @param runtime - the running parts
 */
export function setMailRuntime(ctx: object, runtime: MailRuntime | undefined): void {
  if (runtime) runtimes.set(ctx, runtime);
  else runtimes.delete(ctx);
}
