// Words on the spaces pages. Credits are the invented demo members' (content-seed/members.yaml);
// the en dash between two numbers of a range is common practice in typesetting, and is how
// describeHullRange (app/domain/hulls.ts) writes a range of hulls.
import { describe, expect, it } from "vitest";
import { describeHullRange } from "~/domain/hulls";
import { creditWithoutHulls, typesetHullRanges } from "~/domain/space-words";

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
