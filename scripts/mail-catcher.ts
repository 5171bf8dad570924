// `tsx scripts/mail-catcher.ts --smtp 1025 --http 1080`: runs the local mail catcher until stopped.
import { parseArgs } from "node:util";
import { startMailCatcher } from "./lib/mail-catcher";

const { values } = parseArgs({ options: { smtp: { type: "string", default: "1025" }, http: { type: "string", default: "1080" } } });
const catcher = await startMailCatcher({ smtpPort: Number(values.smtp), httpPort: Number(values.http) });
console.log(`[steradian] mail catcher: SMTP 127.0.0.1:${catcher.smtpPort}, messages at http://127.0.0.1:${catcher.httpPort}/messages`);
const stop = () => void catcher.close().then(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
