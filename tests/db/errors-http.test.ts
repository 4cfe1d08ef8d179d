// The domain errors of db/errors.ts (and the CSV import's) as answered by apiRoute: the one place errors become HTTP.
import { describe, expect, it } from "vitest";
import { ConflictError, ImportConflictError, InvalidInputError, NotFoundError, StaleVersionError } from "@/db/errors";
import { ApiError, apiRoute } from "@/lib/api";
import { InvalidCsvError, UploadInterruptedError } from "@/lib/import/errors";
import { ImportFatalError } from "@/lib/import/types";

async function answer(e: unknown): Promise<{ status: number; body: unknown; text: string }> {
  const route = apiRoute(async () => {
    throw e;
  });
  const res = await route(new Request("http://plateau.test/api/x", { method: "GET" }), { params: Promise.resolve({}) });
  const text = await res.text();
  return { status: res.status, body: JSON.parse(text), text };
}

describe("apiRoute maps domain errors", () => {
  it("StaleVersionError → 409 stale_version with the current version", async () => {
    const r = await answer(new StaleVersionError("This scenario", 4, 2));
    expect(r.status).toBe(409);
    expect(r.text).toBe(
      JSON.stringify({
        error: {
          code: "stale_version",
          message: "This scenario was saved by someone else since you loaded it (now version 4, yours 2). Reload theirs or save yours as a copy.",
          currentVersion: 4,
        },
      }),
    );
  });

  it("NotFoundError → 404 not_found (fields only when the error names one)", async () => {
    expect(await answer(new NotFoundError("Baseline"))).toMatchObject({
      status: 404,
      body: { error: { code: "not_found", message: "Baseline not found." } },
    });
    expect((await answer(new NotFoundError("Baseline"))).body).not.toHaveProperty("error.fields");
    expect((await answer(new NotFoundError("Scenario", "Scenario not found.", "scenarioIds"))).body).toEqual({
      error: { code: "not_found", message: "Scenario not found.", fields: { scenarioIds: ["Scenario not found."] } },
    });
  });

  it("ConflictError and ImportConflictError → 409 conflict; InvalidInputError → 400 invalid_input with fields", async () => {
    expect(await answer(new ConflictError("Last owner.", { role: ["Last owner."] }))).toEqual({
      status: 409,
      body: { error: { code: "conflict", message: "Last owner.", fields: { role: ["Last owner."] } } },
      text: expect.any(String),
    });
    expect((await answer(new ImportConflictError("Deleted during the upload."))).text).toBe(
      JSON.stringify({ error: { code: "conflict", message: "Deleted during the upload." } }),
    );
    expect(await answer(new InvalidInputError("Name taken.", { name: ["Name taken."] }))).toMatchObject({
      status: 400,
      body: { error: { code: "invalid_input", message: "Name taken.", fields: { name: ["Name taken."] } } },
    });
  });

  it("CSV problems → the invalid_csv body, key order included; an interrupted upload → 400 upload_incomplete", async () => {
    const issue = { line: 3, column: "k", value: "x", message: "k must be a number." };
    const r = await answer(new InvalidCsvError([issue], 7, 12));
    expect(r.status).toBe(400);
    expect(r.text).toBe(
      JSON.stringify({
        error: {
          code: "invalid_csv",
          message: "The file has 7 errors (the first 1 are listed). Nothing was stored.",
          errors: [issue],
          errorCount: 7,
          rows: 12,
        },
      }),
    );
    const fatal = await answer(
      new ImportFatalError({ line: null, column: null, value: null, message: "The file is larger than 64 MiB." }, 413, "payload_too_large"),
    );
    expect(fatal.status).toBe(413);
    expect(fatal.text).toBe(
      JSON.stringify({
        error: {
          code: "payload_too_large",
          message: "The file is larger than 64 MiB. Nothing was stored.",
          errors: [{ line: null, column: null, value: null, message: "The file is larger than 64 MiB." }],
          errorCount: 1,
        },
      }),
    );
    expect(await answer(new UploadInterruptedError(new Error("aborted")))).toMatchObject({
      status: 400,
      body: { error: { code: "upload_incomplete", message: "The upload was interrupted; nothing was stored." } },
    });
  });

  it("ApiError keeps its own answer; anything else is a 500 that reveals nothing", async () => {
    expect(await answer(new ApiError(403, "forbidden", "No."))).toMatchObject({
      status: 403,
      body: { error: { code: "forbidden", message: "No." } },
    });
    const spy = console.error;
    console.error = () => undefined;
    try {
      const r = await answer(new Error("secret detail"));
      expect(r.status).toBe(500);
      expect(r.text).not.toContain("secret");
    } finally {
      console.error = spy;
    }
  });
});
