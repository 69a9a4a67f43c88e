// The unit a page shows lengths in: ?unit=in|mm when given, else the signed-in member's choice,
// else inches.
import type { LengthUnit } from "~/domain/units";
import { getUser, type SessionUser } from "~/services/session.server";

export async function readerUnit(request: Request, user?: SessionUser | null): Promise<LengthUnit> {
  const asked = new URL(request.url).searchParams.get("unit");
  if (asked === "in" || asked === "mm") return asked;
  const who = user === undefined ? await getUser(request) : user;
  return who?.units ?? "in";
}
