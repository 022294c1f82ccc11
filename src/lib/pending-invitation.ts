/**
 * An invitation link opened while signed out is remembered (in this browser only) so that, after signing
 * up, confirming and signing in, the person lands back on it. The token is single-use and short-lived.
 */
const KEY = 'ohmstead.pendingInvitation';

export const rememberInvitation = (token: string) => localStorage.setItem(KEY, token);
export const pendingInvitation = () => localStorage.getItem(KEY);
export const forgetInvitation = () => localStorage.removeItem(KEY);
export const invitationPath = (token: string) => `/invitations/accept#token=${token}`;
