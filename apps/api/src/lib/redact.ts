// Keeps one-time link tokens (verification, password reset, invitation) out of anything stored or
// logged in the clear: whoever reads them could take over the account they open.
/** Query parameters whose value opens an account. */
export const SECRET_QUERY_PARAMS = ['token'] as const;
/** Stands in for a token; `[` and `]` survive URL parsing unencoded, so the text stays readable. */
export const REDACTED = '[redacted]';

// `;` also catches `&#38;token=` in HTML; the value ends where a URL, an attribute or a line does
const SECRET_PARAM = new RegExp(`([?&;](?:${SECRET_QUERY_PARAMS.join('|')})=)[^&#\\s"'<>]+`, 'gi');
// the invitation preview carries its token in the path (GET /api/auth/invitations/:token)
const SECRET_PATH = /(\/auth\/invitations\/)(?!accept(?:[/?#]|$))[^/?#]+/gi;

/** `text` with the value of every secret query parameter in it replaced by {@link REDACTED}. */
export function redactSecrets(text: string): string {
  return text.replace(SECRET_PARAM, `$1${REDACTED}`);
}

/** A request URL fit for the log: secret query parameters and path segments redacted. */
export function redactUrl(url: string): string {
  return redactSecrets(url).replace(SECRET_PATH, `$1${REDACTED}`);
}
