import type { Route } from "./+types/api.space";
import { db } from "~/db/index.server";
import { getSpace } from "~/models/spaces.server";
import { badParameter, notFound } from "./api-errors.server";
import { changeJson, measurementJson, readApiUnit, spaceJson } from "./spaces-json.server";

// GET /api/spaces/:id?unit=in|mm : one space (by id or slug) with its measurements, their
// consensus section by section, and the history of changes to its measurements.
export async function loader({ request, params }: Route.LoaderArgs) {
  const unit = readApiUnit(new URL(request.url).searchParams);
  if (!unit) return badParameter("unit", 'unit: use "in" or "mm".');
  const key = params.id;
  if (!/^(\d{1,9}|(?!\d+$)[a-z0-9-]{1,100})$/.test(key)) return badParameter("id", "id: a space's number or its slug.");
  const space = await getSpace(db, /^\d+$/.test(key) ? Number(key) : key);
  if (!space) return notFound(`No space ${key}.`);
  return Response.json({
    unit,
    space: {
      ...spaceJson(space, unit),
      measurements: space.measurements.map((m) => measurementJson(m, unit)),
      writeups: space.writeups,
      changes: space.changes.map((c) => changeJson(c, unit)),
    },
  });
}
