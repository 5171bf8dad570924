/** Body of every API error; the same shape for 401, 403, 404 and 422. */
export function apiError(status: number, code: string, message: string, extra: Record<string, unknown> = {}): Response {
  return Response.json({ error: { code, message, ...extra } }, { status });
}
