// What Sowcast writes about a person's own account: the verification link after sign-up, and the note to an
// address that someone tried to sign up with again. Pure, like messages.ts.
import { build, type LinkBase, type NotifyMessage } from './messages';

export interface VerifyEmailInput extends LinkBase {
  name: string;
  /** Absolute link to the confirmation page (lib/links.ts `verificationLink`). */
  link: string;
  validHours: number;
}

export function verifyEmail(m: VerifyEmailInput): NotifyMessage {
  return build(
    m,
    'Confirm your e-mail for Sowcast',
    [
      { kind: 'para', text: `Hello ${m.name}, confirm that this address is yours to finish setting up your Sowcast account.` },
      { kind: 'link', label: 'Confirm my e-mail', url: m.link },
      { kind: 'para', text: `The link works for ${m.validHours} hours. Until then you can plan one property of your own, but nobody can add you to theirs.` },
      { kind: 'para', text: 'If you did not sign up, ignore this message: the account stays unconfirmed.' },
    ],
    { title: 'Confirm your e-mail', body: 'Finish setting up your Sowcast account', url: m.link, tag: 'verify-email' },
  );
}

export interface SignUpAgainInput extends LinkBase {
  name: string;
  signInUrl: string;
}

/** Someone signed up with an address that already has an account: tell its owner, give nothing away to them. */
export function signUpAgain(m: SignUpAgainInput): NotifyMessage {
  return build(
    m,
    'Someone tried to sign up to Sowcast with your address',
    [
      { kind: 'para', text: `Hello ${m.name}, someone just tried to create a Sowcast account with this e-mail address, which already has one.` },
      { kind: 'para', text: 'If it was you, sign in with your existing account instead. If it was not, nothing changed and you need do nothing.' },
      { kind: 'link', label: 'Sign in', url: m.signInUrl },
    ],
    { title: 'Sign-up with your address', body: 'Your account already exists; nothing changed', url: m.signInUrl, tag: 'sign-up-again' },
  );
}
