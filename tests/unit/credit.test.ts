// How an author is credited beside a write-up: the hull number is added only when the credit the
// member chose does not already name it (demo credits from content-seed/members.yaml; invented).
import { describe, expect, it } from "vitest";
import { hullBesideCredit } from "~/domain/hulls";

describe("the hull number beside an author's credit", () => {
  it("is left out when the credit names that hull", () => {
    expect(hullBesideCredit("Nora P., hull 147", 147)).toBeNull();
    expect(hullBesideCredit("Gareth Lindqvist, Marram (402)", 402)).toBeNull();
  });

  it("is added when the credit names no hull, or another number that merely contains it", () => {
    expect(hullBesideCredit("Tomasz W., Halfpenny", 12)).toBe(12);
    expect(hullBesideCredit("Nora P., hull 147", 14)).toBe(14);
    expect(hullBesideCredit("Nora P., hull 147", 1)).toBe(1);
  });

  it("is nothing when the write-up names no hull", () => {
    expect(hullBesideCredit("Hal Dunmore, hull 211", null)).toBeNull();
  });
});
