// Words on the spaces pages. Credits are the invented demo members' (content-seed/members.yaml);
// the en dash between two numbers of a range is common practice in typesetting, and is how
// describeHullRange (app/domain/hulls.ts) writes a range of hulls.
import { describe, expect, it } from "vitest";
import { describeHullRange } from "~/domain/hulls";
import { creditWithoutHulls, describeSpaceFilter, typesetHullRanges } from "~/domain/space-words";

describe("a measurer's credit beside the hull measured", () => {
  it("leaves out the hull numbers the credit names, so the hull measured is said once", () => {
    expect(creditWithoutHulls("Ruth Ambler, hull 288")).toBe("Ruth Ambler");
    expect(creditWithoutHulls("Doug Pardoe, hulls 579 and 34")).toBe("Doug Pardoe");
    expect(creditWithoutHulls("Joan P., Lark Rising (97)")).toBe("Joan P., Lark Rising");
    expect(creditWithoutHulls("Gareth Lindqvist, Marram (402)")).toBe("Gareth Lindqvist, Marram");
  });

  it("keeps everything else as the member chose it", () => {
    expect(creditWithoutHulls("Tomasz W., Halfpenny")).toBe("Tomasz W., Halfpenny");
    expect(creditWithoutHulls("Crew of Forty Winks")).toBe("Crew of Forty Winks");
    expect(creditWithoutHulls("Hull 12")).toBe("Hull 12"); // nothing else left: kept whole
  });
});

describe("hull ranges in the names of spaces", () => {
  it("take the en dash describeHullRange writes", () => {
    expect(typesetHullRanges("Under the starboard settee, aft bay (hulls 120-298)")).toBe(
      `Under the starboard settee, aft bay (${describeHullRange({ from: 120, to: 298 }).toLowerCase()})`,
    );
    expect(typesetHullRanges("Aft bay (hulls 1-119, old tank bay)")).toBe("Aft bay (hulls 1–119, old tank bay)");
  });

  it("leaves other hyphens alone", () => {
    expect(typesetHullRanges("Fore-and-aft shelf, 2-part lid")).toBe("Fore-and-aft shelf, 2-part lid");
  });
});

describe("the sentence above the register of spaces", () => {
  const mk1 = { label: "Mk I", from: 1, to: 298 }; // the demo class's variants (app/domain/hulls.ts)
  it("names the filter that applies", () => {
    expect(describeSpaceFilter({ count: 26, hull: null, hullVariant: null, variant: null })).toBe("26 spaces.");
    expect(describeSpaceFilter({ count: 1, hull: 402, hullVariant: "Mk II", variant: null })).toBe("1 space on hull 402 (Mk II).");
    expect(describeSpaceFilter({ count: 21, hull: null, hullVariant: null, variant: mk1 })).toBe("21 spaces on Mk I (hulls 1–298).");
  });

  it("says the variant is set aside when a hull number is given too", () => {
    expect(describeSpaceFilter({ count: 13, hull: 318, hullVariant: "Mk II", variant: mk1 })).toBe(
      "13 spaces on hull 318 (Mk II); the variant chosen (Mk I) is set aside while a hull number is given.",
    );
  });
});
