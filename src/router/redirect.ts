// The `redirect` query of the sign-in page: only a path inside this app may be followed after sign-in.

// Returns the path when it is same-app (`/units/7?tab=events`), null for anything else (`//evil.example`, `https://…`).
export function safeRedirect(value: unknown): string | null {
  const path = Array.isArray(value) ? value[0] : value;
  if (typeof path !== 'string' || !path.startsWith('/') || path.startsWith('//') || path.startsWith('/\\')) return null;
  return path;
}
