// The PDF of an issued digest. GET serves it (building it first if it was never built); POST builds
// it if needed and answers with where it is, for the page that shows progress while it builds.
// An issued edition never changes, so its PDF is built once and kept in the object store.
import { data } from "react-router";
import type { Route } from "./+types/digest.$year.pdf";
import { db } from "~/db/index.server";
import { digestFileName } from "~/domain/digest";
import { CLASS_NAME } from "~/domain/hulls";
import { getIssued, recordPdf } from "~/models/digests.server";
import { buildDigestPdf } from "~/services/digest-print.server";
import { env } from "~/services/env.server";
import { getObject, putObject } from "~/services/storage.server";
import { readForm } from "~/services/form-body.server";
import { digestYearAndEdition } from "./digest-params.server";

const building = new Map<number, Promise<{ key: string; bytes: number; ms: number }>>();

async function findEdition(params: { year: string }, request: Request) {
  const { year, edition } = digestYearAndEdition(params, request);
  const issued = await getIssued(db, year, edition);
  if (!issued) throw data("No digest has been issued for that year.", { status: 404 });
  return { year, issued };
}

type Issued = NonNullable<Awaited<ReturnType<typeof getIssued>>>;

async function ensurePdf(year: number, issued: Issued) {
  if (issued.pdfKey) {
    const found = await getObject(issued.pdfKey);
    if (found) {
      await found.body.cancel().catch(() => undefined);
      return { key: issued.pdfKey, bytes: found.contentLength ?? 0, ms: 0 };
    }
  }
  let job = building.get(issued.id);
  if (!job) {
    job = (async () => {
      const started = performance.now();
      const pdf = await buildDigestPdf(issued.snapshot, { className: CLASS_NAME, appUrl: env.APP_URL });
      const key = `digests/${year}/edition-${issued.edition}.pdf`;
      await putObject(key, pdf, "application/pdf");
      await recordPdf(db, issued.id, key);
      return { key, bytes: pdf.byteLength, ms: Math.round(performance.now() - started) };
    })().finally(() => building.delete(issued.id));
    building.set(issued.id, job);
  }
  return job;
}

export async function loader({ params, request }: Route.LoaderArgs) {
  const { year, issued } = await findEdition(params, request);
  const { key } = await ensurePdf(year, issued);
  const object = await getObject(key);
  if (!object) throw data("The PDF could not be read back from storage; try again.", { status: 503 });
  const headers = new Headers({
    "Content-Type": "application/pdf",
    "Content-Disposition": `inline; filename="${digestFileName(CLASS_NAME, year, issued.edition)}"`,
    "Cache-Control": "public, max-age=3600",
    "X-Content-Type-Options": "nosniff",
  });
  if (object.contentLength !== null) headers.set("Content-Length", String(object.contentLength));
  return new Response(object.body, { headers });
}

export async function action({ params, request }: Route.ActionArgs) {
  const form = await readForm(request);
  const url = new URL(request.url);
  const edition = form.get("edition");
  if (typeof edition === "string" && edition) url.searchParams.set("edition", edition);
  const { year, issued } = await findEdition(params, new Request(url));
  const built = await ensurePdf(year, issued);
  return {
    url: `/digest/${year}/pdf?edition=${issued.edition}`,
    fileName: digestFileName(CLASS_NAME, year, issued.edition),
    bytes: built.bytes,
    builtNow: built.ms > 0,
    ms: built.ms,
  };
}
