import type { Route } from "./+types/api.spaces";
import { db } from "~/db/index.server";
import { FIRST_HULL, LAST_HULL } from "~/domain/hulls";
import { listSpaces } from "~/models/spaces.server";
import { badParameter } from "./api-errors.server";
import { readApiUnit, spaceJson } from "./spaces-json.server";

// GET /api/spaces?unit=in|mm&hull= : every space with its sections and the consensus of its measurements.
export async function loader({ request }: Route.LoaderArgs) {
  const q = new URL(request.url).searchParams;
  const unit = readApiUnit(q);
  if (!unit) return badParameter("unit", 'unit: use "in" or "mm".');
  const rawHull = (q.get("hull") ?? "").trim();
  let hull: number | null = null;
  if (rawHull !== "") {
    hull = /^\d+$/.test(rawHull) ? Number(rawHull) : Number.NaN;
    if (!(hull >= FIRST_HULL && hull <= LAST_HULL)) {
      return badParameter("hull", `hull: a whole number from ${FIRST_HULL} to ${LAST_HULL}.`);
    }
  }
  const spaces = await listSpaces(db, { hull });
  return Response.json({ unit, spaces: spaces.map((sp) => spaceJson(sp, unit)) });
}
