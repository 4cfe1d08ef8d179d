import { baselineImportRoute } from "@/lib/baseline-import-route";
import { runWireClassImport } from "@/lib/import/run-classes";

export const dynamic = "force-dynamic";

/** Import wire classes (CSV, format on /help/csv); mode, dry run, body and limits as in lib/baseline-import-route.ts. */
export const POST = baselineImportRoute(runWireClassImport);
