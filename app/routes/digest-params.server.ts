// The year (four digits) and the optional edition (?edition=1..1000) of the digest routes'
// addresses; anything else is a page that does not exist.
import { data } from "react-router";

export function digestYear(params: { year: string }, notFoundMessage = "No such year."): number {
  if (!/^\d{4}$/.test(params.year)) throw data(notFoundMessage, { status: 404 });
  return Number(params.year);
}

export function digestYearAndEdition(params: { year: string }, request: Request): { year: number; edition: number | undefined } {
  const year = digestYear(params, "No such digest.");
  const raw = new URL(request.url).searchParams.get("edition");
  const edition = raw === null ? undefined : Number(raw);
  if (edition !== undefined && !(Number.isInteger(edition) && edition >= 1 && edition <= 1000)) throw data("No such digest.", { status: 404 });
  return { year, edition };
}
