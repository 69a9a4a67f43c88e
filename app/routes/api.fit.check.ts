import type { Route } from "./+types/api.fit.check";
import { fitItem, VERDICT_TEXT } from "~/domain/fit";
import { boxInUnit, orientationJson, parseCheckParams } from "~/domain/fit-search";
import { badParameter } from "./api-errors.server";

// GET /api/fit/check?item=LxWxH&space=LxWxH&unit=in|mm&upright=&clearance=&opening=WxH&face=top|front
// One box against one space given by its inside length x width x height (see README, "API").
export function loader({ request }: Route.LoaderArgs) {
  const params = parseCheckParams(new URL(request.url).searchParams);
  if (!params.ok) return badParameter(params.parameter, params.message);
  const result = fitItem({
    item: params.item,
    orientation: params.orientation,
    clearanceMm: params.clearanceMm,
    space: { sections: [params.space], opening: params.opening },
  });
  const section = result.sections[0];
  return Response.json({
    unit: params.unit,
    fits: result.verdict === "fits",
    verdict: result.verdict,
    message: VERDICT_TEXT[result.verdict],
    throughOpening: result.passesOpening,
    // When it does not fit: the placement that misses by the least; negative clearances are shortfalls.
    orientation: orientationJson(section.placement),
    clearances: boxInUnit(section.leftoverMm, params.unit),
    inARow: section.row?.count ?? 0,
    // How the items of that row lie (it may differ from `orientation`, the placement of one item):
    // null when fewer than two fit.
    row: section.row && section.row.count > 1
      ? { count: section.row.count, along: section.row.axis, orientation: orientationJson(section.row.placement) }
      : null,
  });
}
