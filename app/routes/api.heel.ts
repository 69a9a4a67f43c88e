import type { Route } from "./+types/api.heel";
import { heelAnswer, parseHeelParams } from "~/domain/tool-params";
import { badParameter } from "./api-errors.server";

// GET /api/heel?displacement=&gm=&weight=&distance=  → { heelDegrees }
// GET /api/heel?displacement=&heel=&weight=&distance= → { gm }
// All weights in one unit, all lengths in one unit (see README, "API").
export function loader({ request }: Route.LoaderArgs) {
  const params = parseHeelParams(new URL(request.url).searchParams);
  if (!params.ok) return badParameter(params.parameter, params.message);
  return Response.json(heelAnswer(params), { headers: { "Cache-Control": "no-store" } });
}
