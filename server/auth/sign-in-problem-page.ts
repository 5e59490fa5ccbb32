import { messagePage } from '../lib/message-page';

/** A plain page for when the round trip to the provider goes wrong: what happened, and a way back. */
export function signInProblemPage(title: string, explanation: string): string {
  return messagePage(title, explanation, { href: '/sign-in', label: 'Try signing in again' });
}
