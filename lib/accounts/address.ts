/** The caller's address as the proxy in front reports it, for rate limiting account requests. */
export function requestAddress(request: Request): string {
  const forwarded = request.headers.get("x-forwarded-for");
  return forwarded?.split(",")[0]?.trim() || request.headers.get("x-real-ip") || "local";
}
