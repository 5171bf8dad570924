/**
 * Why a seal, request, decision or comment was refused, with the HTTP status the API answers
 * and the field a form shows it beside (docs/decisions/0010-sealed-versions.md).
 */
export class VersionError extends Error {
  constructor(
    readonly status: 403 | 404 | 409 | 422,
    readonly code: string,
    message: string,
    readonly field: string | null = null,
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

const pgCode = (e: unknown) => (e as { code?: string })?.code;
const pgConstraint = (e: unknown) => (e as { constraint?: string })?.constraint ?? "";

/**
 * A constraint or trigger of the database that refused what two requests at the same moment
 * tried: the app checks first, the database is the backstop; either way the caller gets 409.
 */
export function conflictFromDatabase(e: unknown, message: string): VersionError | null {
  const code = pgCode(e);
  if (code === "23505" || (code === "23514" && /^(figure_version_sequence|version_event_closed)$/.test(pgConstraint(e)))) {
    return new VersionError(409, "conflict", message, null, { constraint: pgConstraint(e) });
  }
  return null;
}
