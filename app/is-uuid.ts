const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Ids in URLs are checked before they reach PostgreSQL, which refuses anything else as a uuid. */
export function isUuid(value: string): boolean {
  return UUID.test(value);
}
