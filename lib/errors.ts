/**
 * One error vocabulary for route handlers and server actions: `kind:surface` codes with a human message.
 * Database and unexpected errors are logged, never shown.
 */
export type ErrorKind =
  | "bad_request"
  | "unauthorized"
  | "forbidden"
  | "not_found"
  | "conflict"
  | "unprocessable"
  | "too_large"
  | "unsupported_media"
  | "rate_limited"
  | "unavailable"
  | "internal";

const statusByKind: Record<ErrorKind, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  unprocessable: 422,
  too_large: 413,
  unsupported_media: 415,
  rate_limited: 429,
  unavailable: 503,
  internal: 500,
};

const defaultMessages: Record<ErrorKind, string> = {
  bad_request: "The request could not be read.",
  unauthorized: "Sign in to continue.",
  forbidden: "Your role does not allow this.",
  not_found: "Not found.",
  conflict: "This conflicts with the current state; reload and try again.",
  unprocessable: "Some values are not valid.",
  too_large: "The request is too large.",
  unsupported_media: "Send the request as JSON (Content-Type: application/json).",
  rate_limited: "Too many attempts. Wait a few minutes and try again.",
  unavailable: "A service Ballast depends on is not answering. Try again shortly.",
  internal: "Something went wrong on our side. Nothing was changed.",
};

/** Field-level messages: field path → message. */
export type FieldErrors = Record<string, string>;

/** The JSON shape every error response shares. */
export interface ErrorBody {
  error: { code: string; message: string; fields?: FieldErrors };
}

/** An error the app expects and explains: `new AppError("not_found:run")`. */
export class AppError extends Error {
  readonly kind: ErrorKind;
  readonly surface: string;
  readonly fields?: FieldErrors;

  constructor(code: `${ErrorKind}:${string}`, message?: string, fields?: FieldErrors) {
    const [kind, surface] = code.split(":") as [ErrorKind, string];
    super(message ?? defaultMessages[kind]);
    this.kind = kind;
    this.surface = surface;
    this.fields = fields;
  }

  get code(): string {
    return `${this.kind}:${this.surface}`;
  }

  get status(): number {
    return statusByKind[this.kind];
  }

  /** The shared error body. */
  toBody(): ErrorBody {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) } };
  }

  /** A JSON response with the honest status code. */
  toResponse(): Response {
    return Response.json(this.toBody(), { status: this.status });
  }
}

/** Turn anything thrown into an AppError; unexpected errors are logged and hidden behind a generic message. */
export function toAppError(error: unknown): AppError {
  if (error instanceof AppError) return error;
  console.error("[ballast] unexpected error", error);
  return new AppError("internal:server");
}
