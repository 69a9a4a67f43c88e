import { Link, useLocation } from "react-router";
import type { LengthUnit } from "~/domain/units";

/** "Show in: inches | millimetres": links to the same page with ?unit=, other parameters kept. */
export function UnitToggle({ unit, search }: { unit: LengthUnit; search?: (to: LengthUnit) => string }) {
  const location = useLocation();
  const href = (to: LengthUnit) => {
    if (search) return `${location.pathname}?${search(to)}`;
    const params = new URLSearchParams(location.search);
    params.set("unit", to);
    return `${location.pathname}?${params}`;
  };
  const option = (to: LengthUnit, label: string) =>
    to === unit ? (
      <span aria-current="true" className="rounded-sm bg-deep-700 px-2 py-1 text-cloth-50">{label}</span>
    ) : (
      <Link to={href(to)} replace className="rounded-sm px-2 py-1 text-deep-700 no-underline hover:bg-deep-50">{label}</Link>
    );
  return (
    <p className="flex items-center gap-1 text-step--1" aria-label="Units">
      <span className="mr-1 text-ink-soft">Show sizes in</span>
      {option("in", "inches")}
      {option("mm", "millimetres")}
    </p>
  );
}
