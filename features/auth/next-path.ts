import type { Href } from 'expo-router';

/**
 * Where to go after signing in, when the sign-in page was reached from a page of ours (an e-mailed link
 * to a notice, a reload after the session ran out). Only a path on this site is accepted: it starts with
 * one "/" and holds no backslash, whitespace or control character, so "//host", "/\host" (which browsers
 * read as another site) and "https://…" are refused and the person lands on their own start page.
 */
export function safeNextPath(value: unknown): string | null {
  const text = Array.isArray(value) ? value[0] : value;
  if (typeof text !== 'string' || text.length === 0 || text.length > 2000) return null;
  if (!text.startsWith('/') || text.startsWith('//')) return null;
  if (/[\\\s\u0000-\u001f\u007f]/.test(text)) return null;
  // Back to the sign-in page would only go round in a circle.
  if (/^\/sign-in(?:[/?#]|$)/.test(text)) return null;
  return text;
}

/*
 * The page a signed-out visitor asked for, kept in memory as well as in the `next` parameter: on the web,
 * expo-router's redirect out of the signed-in group passes through "/" and drops the query on the way.
 */
let remembered: string | null = null;

/** Notes the page to come back to after signing in (ignored unless it is a safe path of ours). */
export function rememberNextPath(path: string): void {
  remembered = safeNextPath(path);
}

/** The page to go to after signing in: the `next` parameter, else the remembered page. */
export function nextPathAfterSignIn(param: unknown): Extract<Href, string> | null {
  // A path of this site (safeNextPath checked it); which page it names is only known at run time.
  return (safeNextPath(param) ?? remembered) as Extract<Href, string> | null;
}

/** Forgets the remembered page once it has been used. */
export function forgetNextPath(): void {
  remembered = null;
}
