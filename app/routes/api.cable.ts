import type { Route } from "./+types/api.cable";
import { cableAnswer, parseCableParams } from "~/domain/tool-params";
import { badParameter } from "./api-errors.server";

// GET /api/cable?current=&length=&voltage=&drop=&insulation=&engineSpace=
// → { circularMils, awgByDrop, awgByAmpacity, awg, dropPercent, maxOvercurrentAmps } (see README, "API").
export function loader({ request }: Route.LoaderArgs) {
  const params = parseCableParams(new URL(request.url).searchParams);
  if (!params.ok) return badParameter(params.parameter, params.message);
  const { status, body } = cableAnswer(params.input);
  return Response.json(body, { status, headers: { "Cache-Control": "no-store" } });
}
