import { MailMessagesResponseSchema, type MailMessagesResponse } from '../../shared/schemas/mail';
import { api } from './client';

/** Messages the development mail server captured and the outgoing queue, newest first (admin). */
export function listMailMessages(): Promise<MailMessagesResponse> {
  return api('/mail/messages', { schema: MailMessagesResponseSchema });
}
