/** Where people land after signing in when no (usable) return address was given. */
export const DEFAULT_AFTER_SIGN_IN = '/home';

/**
 * The in-app path to go to after signing in. Only paths inside this app are accepted (one leading
 * slash, no scheme, no `//host` and no backslash tricks), so a crafted link cannot send someone to
 * another site; sign-in pages themselves fall back to the default.
 */
export function safeReturnUrl(candidate: string | null | undefined): string {
  if (!candidate || !candidate.startsWith('/') || candidate.startsWith('//')) {
    return DEFAULT_AFTER_SIGN_IN;
  }
  if (candidate.includes('\\') || /[\u0000-\u001f]/.test(candidate)) {
    return DEFAULT_AFTER_SIGN_IN;
  }
  if (/^\/(sign-in|set-password)(?:[/?#]|$)/.test(candidate)) {
    return DEFAULT_AFTER_SIGN_IN;
  }
  return candidate;
}
