/** Absolute links that leave the app (invitation e-mails, notifications, calendar feeds). */
export function appBaseUrl(): string {
  return (process.env.APP_BASE_URL ?? process.env.NEXTAUTH_URL ?? 'http://127.0.0.1:3000').replace(/\/$/, '');
}

export const invitationLink = (token: string) => `${appBaseUrl()}/invitations/${token}`;

export const verificationLink = (token: string) => `${appBaseUrl()}/verify-email/${token}`;
export const signInLink = () => `${appBaseUrl()}/sign-in`;
