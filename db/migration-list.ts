// Every migration, imported statically so that tsx, vitest and the bundler all load them the
// same way (Kysely's file provider uses a dynamic import() that plain Node cannot apply to .ts).
// db/migration-list.test.ts fails when a file in db/migrations/ is missing here.
import type { Migration } from "kysely";
import * as m20261201_1200 from "./migrations/2026_12_01_1200_create_accounts_and_manuscripts";
import * as m20261201_1500 from "./migrations/2026_12_01_1500_create_datasets";
import * as m20261201_1600 from "./migrations/2026_12_01_1600_lock_manuscript_in_member_trigger";
import * as m20261201_1700 from "./migrations/2026_12_01_1700_check_dataset_row_revision_per_statement";
import * as m20261202_0900 from "./migrations/2026_12_02_0900_create_figures";
import * as m20261203_0900 from "./migrations/2026_12_03_0900_create_figure_versions";
import * as m20261204_0900 from "./migrations/2026_12_04_0900_create_user_sessions";
import * as m20261204_1100 from "./migrations/2026_12_04_1100_create_figure_exports";
import * as m20261204_1200 from "./migrations/2026_12_04_1200_retire_datasets";

export const MIGRATIONS: Record<string, Migration> = {
  "2026_12_01_1200_create_accounts_and_manuscripts": m20261201_1200,
  "2026_12_01_1500_create_datasets": m20261201_1500,
  "2026_12_01_1600_lock_manuscript_in_member_trigger": m20261201_1600,
  "2026_12_01_1700_check_dataset_row_revision_per_statement": m20261201_1700,
  "2026_12_02_0900_create_figures": m20261202_0900,
  "2026_12_03_0900_create_figure_versions": m20261203_0900,
  "2026_12_04_0900_create_user_sessions": m20261204_0900,
  "2026_12_04_1100_create_figure_exports": m20261204_1100,
  "2026_12_04_1200_retire_datasets": m20261204_1200,
};
