// Where `npm test` (scripts/test.sh) put the running stack.
function need(name: string): string {
  const v = process.env[name];
  if (!v) throw new Error(`${name} is not set: run the integration and browser tests through 'npm test'.`);
  return v;
}

export const testEnv = {
  get appUrl() { return need("TEST_APP_URL"); },
  get appDatabaseUrl() { return need("TEST_APP_DATABASE_URL"); },
  get templateDatabaseUrl() { return need("TEST_TEMPLATE_DATABASE_URL"); },
  get mailUrl() { return need("TEST_MAIL_URL"); },
  get storageDir() { return need("TEST_STORAGE_DIR"); },
  get maxBytes() { return Number(need("TEST_UPLOAD_MAX_BYTES")); },
  get maxRows() { return Number(need("TEST_UPLOAD_MAX_ROWS")); },
};
