// The prediction command line, run by bin/predict (`npm run --silent predict`) from a bundle of
// this file: a prediction request as JSON on standard input, the response as JSON on standard
// output (docs/product.md, "Prediction contract"; request fields in
// docs/decisions/0003-engine-conventions.md). Exit status 2 with
// { "error": { code, message, field } } on bad input, so scripts can tell it from a crash.
import { EngineInputError, runPrediction } from "../app/engine/index";

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString("utf8");
}

function fail(code: string, message: string, field: string): never {
  process.stdout.write(`${JSON.stringify({ error: { code, message, field } })}\n`);
  process.exit(2);
}

const text = await readStdin();
let request: unknown;
try {
  request = JSON.parse(text.replace(/^\uFEFF/, ""));
} catch (error) {
  fail("malformed_json", `the request is not valid JSON: ${(error as Error).message}`, "");
}
try {
  process.stdout.write(`${JSON.stringify(runPrediction(request))}\n`);
} catch (error) {
  if (error instanceof EngineInputError) fail(error.code, error.message, error.field);
  throw error;
}
