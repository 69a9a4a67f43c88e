// "What fits here" on a space's page: the count in a row is stated only beside a placement in
// which that many fit. Item sizes from the BCI group size chart (Battery Council International,
// maximum case sizes) and from content-seed/items.yaml (the tool box, invented demo data); the
// space from content-seed/spaces.yaml (invented demo data). All arithmetic below is by hand.
import { describe, expect, it } from "vitest";
import { bciGroup } from "~/domain/battery-groups";
import type { Box, Placement } from "~/domain/fit";
import { describeRow, fitHere, type FitHereSection } from "~/domain/fit-here";

// 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C).
const IN = 25.4;
const inches = (l: number, w: number, h: number): Box => ({ length: l * IN, width: w * IN, height: h * IN });

function group(name: string): Box {
  const g = bciGroup(name);
  if (!g) throw new Error(`no group ${name}`);
  return g.mm;
}

/** Independent of fit.ts: the row's items end to end along its axis, one across and one up. */
function rowFits(item: Box, section: Box, count: number, axis: "length" | "width", p: Placement): boolean {
  const slack = 1e-6;
  return (["length", "width", "height"] as const).every((a) =>
    (a === axis ? count : 1) * item[p[a]] <= section[a] + slack,
  );
}

// The port cockpit locker of a Mk I (spaces.yaml, cockpit-locker-port-mk1). Its main section is
// the median of the three members' measurements, dimension by dimension:
//   length: 26 7/8, 27 1/8, 27 -> 27 in; width: 13 5/8, 13 1/2, 13 1/2 -> 13 1/2 in;
//   height: 21, 20 7/8, 21 -> 21 in. The bottom wedge (27 x 7 x 6 in) was never measured.
const locker: FitHereSection[] = [
  { label: "main", box: inches(27, 13.5, 21) },
  { label: "bottom wedge over the hull", box: inches(27, 7, 6) },
];
const lid = { width: 19 * IN, height: 11.5 * IN, face: "top" as const };

describe("what fits in the port cockpit locker (Mk I)", () => {
  it("BCI group 27 (12 1/16 x 6 13/16 x 8 7/8 in, upright): 2 in a row as it lies, 3 turned, and the sentence says so", () => {
    const g27 = group("27");
    const r = fitHere(g27, "upright", locker, lid, "in");
    // One upright, length fore and aft (the most room on its tightest side):
    //   27 - 12 1/16 = 14 15/16; 13 1/2 - 6 13/16 = 6 11/16; 21 - 8 7/8 = 12 1/8 in.
    //   Turned it would leave 27 - 6 13/16 = 20 3/16 and 13 1/2 - 12 1/16 = 1 7/16: tighter.
    expect(r.placement).toEqual({ length: "length", width: "width", height: "height" });
    // As it lies: 2 x 12 1/16 = 24 1/8 <= 27, but 3 x 12 1/16 = 36 3/16 > 27 in: only 2.
    expect(rowFits(g27, locker[0].box, 3, "length", r.placement!)).toBe(false);
    expect(rowFits(g27, locker[0].box, 2, "length", r.placement!)).toBe(true);
    // Turned, width fore and aft: 3 x 6 13/16 = 20 7/16 <= 27 < 4 x 6 13/16 = 27 1/4 in: 3.
    expect(r.row).toEqual({ count: 3, axis: "length", placement: { length: "width", width: "length", height: "height" } });
    expect(rowFits(g27, locker[0].box, 3, r.row!.axis, r.row!.placement)).toBe(true);
    expect(rowFits(g27, locker[0].box, 4, r.row!.axis, r.row!.placement)).toBe(false);
    expect(r.text).toBe(
      "Upright, length fore and aft, in the main; room left 14 15/16 × 6 11/16 × 12 1/8 in; " +
        "3 would fit in a row fore and aft, each upright, turned: width fore and aft.",
    );
  });

  it("the tool box (16 1/4 x 7 1/2 x 7 1/4 in, any way up): 1 as it lies, 3 on its end", () => {
    const box = inches(16.25, 7.5, 7.25);
    const r = fitHere(box, "any", locker, lid, "in");
    // On its side (width up), length fore and aft: 27 - 16 1/4 = 10 3/4; 13 1/2 - 7 1/4 = 6 1/4;
    // 21 - 7 1/2 = 13 1/2 in; tightest 6 1/4 (upright it would be 13 1/2 - 7 1/2 = 6).
    expect(r.placement).toEqual({ length: "length", width: "height", height: "width" });
    // As it lies, no second one: 2 x 16 1/4 = 32 1/2 > 27 fore and aft, 2 x 7 1/4 = 14 1/2 > 13 1/2 across.
    expect(rowFits(box, locker[0].box, 2, "length", r.placement!)).toBe(false);
    expect(rowFits(box, locker[0].box, 2, "width", r.placement!)).toBe(false);
    // On its end (length up), height fore and aft: 3 x 7 1/4 = 21 3/4 <= 27 (room 5 1/4), 7 1/2 across,
    // 16 1/4 up (room 4 3/4). Width fore and aft would also take 3 (3 x 7 1/2 = 22 1/2, room 4 1/2),
    // but leaves less on its tightest side; 4 x 7 1/4 = 29 > 27.
    expect(r.row).toEqual({ count: 3, axis: "length", placement: { length: "height", width: "width", height: "length" } });
    expect(rowFits(box, locker[0].box, 3, r.row!.axis, r.row!.placement)).toBe(true);
    expect(r.text).toBe(
      "On its side (width up), length fore and aft, in the main; room left 10 3/4 × 6 1/4 × 13 1/2 in; " +
        "3 would fit in a row fore and aft, each on its end (length up), height fore and aft.",
    );
  });
});

describe("the row in words", () => {
  const g24 = group("24"); // BCI chart: 10 1/4 x 6 13/16 x 8 7/8 in

  it("no placement is named when the row lies as the one item does", () => {
    // 33 x 7 5/16 x 9 3/8 in: 3 x 10 1/4 = 30 3/4 <= 33 < 4 x 10 1/4 = 41 fore and aft; turned,
    // 10 1/4 across would not go in 7 5/16.
    const r = fitHere(g24, "upright", [{ label: "main", box: inches(33, 7 + 5 / 16, 9 + 3 / 8) }], undefined, "in");
    expect(r.text).toBe("Upright, length fore and aft; room left 22 3/4 × 1/2 × 1/2 in; 3 would fit in a row fore and aft.");
  });

  it("a second worked example: group 24 in 21 x 11 x 9 1/2 in, 2 as it lies, 3 turned", () => {
    // As it lies: 21 / 10 1/4 -> 2; turned, the 6 13/16 in side fore and aft: 3 x 6 13/16 = 20 7/16 <= 21.
    // One item: length fore and aft leaves 10 3/4, 4 3/16, 5/8; turned 14 3/16, 3/4, 5/8: a tie on
    // the tightest side (5/8), so the first listed (length fore and aft) is kept.
    const section = inches(21, 11, 9.5);
    const r = fitHere(g24, "upright", [{ label: "main", box: section }], undefined, "in");
    expect(rowFits(g24, section, 3, "length", r.placement!)).toBe(false);
    expect(r.text).toBe(
      "Upright, length fore and aft; room left 10 3/4 × 4 3/16 × 5/8 in; 3 would fit in a row fore and aft, each upright, turned: width fore and aft.",
    );
  });

  it("nothing about a row when only one fits, and no sentence when none does", () => {
    // 12 x 8 x 10 in: 2 x 6 13/16 = 13 5/8 > 12, and 12 - 10 1/4 leaves too little for a second either way.
    expect(fitHere(g24, "upright", [{ label: "main", box: inches(12, 8, 10) }], undefined, "in").text).toBe(
      "Upright, length fore and aft; room left 1 3/4 × 1 3/16 × 1 1/8 in.",
    );
    const none = fitHere(g24, "upright", [{ label: "main", box: inches(10, 7, 9) }], undefined, "in");
    expect(none).toMatchObject({ verdict: "does-not-fit", row: null, text: "" });
  });

  it("athwartships rows", () => {
    expect(describeRow({ count: 2, axis: "width", placement: { length: "length", width: "width", height: "height" } }, { length: "length", width: "width", height: "height" })).toBe(
      "2 would fit in a row athwartships",
    );
  });
});
