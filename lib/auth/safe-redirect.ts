/**
 * The one place a `next` address (where to go after sign-in) is checked: only a path on this site is followed.
 * Browsers read "\" as "/" and drop tabs and line breaks inside an address, so "/\evil.example" or "/\t/evil.example"
 * would leave the site; such values, and anything that does not resolve to this origin, give the fallback.
 */

const FALLBACK = "/home";
const PROBE_ORIGIN = "http://ballast.invalid";

/** A same-site path (path, query and fragment) to go to after sign-in, or "/home". */
export function safeNextPath(value: string | string[] | null | undefined, fallback = FALLBACK): string {
  const next = Array.isArray(value) ? value[0] : value;
  if (typeof next !== "string" || next.length === 0 || next.length > 2048) return fallback;
  // Control characters (tab, line breaks, NUL…), backslashes, and anything but a single leading slash.
  if (/[\u0000-\u001f\u007f\\]/.test(next)) return fallback;
  if (!next.startsWith("/") || next.startsWith("//")) return fallback;
  let url: URL;
  try {
    url = new URL(next, PROBE_ORIGIN);
  } catch {
    return fallback;
  }
  if (url.origin !== PROBE_ORIGIN) return fallback;
  const path = `${url.pathname}${url.search}${url.hash}`;
  // The normalised path must still be a single-slash path (e.g. "/./\/evil" cannot become "//evil").
  if (!path.startsWith("/") || path.startsWith("//")) return fallback;
  // Never back to the sign-in page itself or the auth library's endpoints.
  if (url.pathname === "/sign-in" || url.pathname.startsWith("/api/")) return fallback;
  return path;
}
