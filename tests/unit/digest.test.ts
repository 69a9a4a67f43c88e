// The digest's pure rules: arranging entries, the chart's scale, the e-mail's text and escaping,
// batches, file names and the photo a write-up's Markdown names.
import { describe, expect, it } from "vitest";
import {
  digestFileName, digestTitle, type DigestSnapshot, firstPhotoThumbnail, formatDigestDate, groupIntoSections,
  inBatches, initialArrangement, issueProblems, moveEntry, orderedEntries, sectionFor, UNFILED_SECTION,
} from "~/domain/digest";
import { layoutBarChart, niceStep } from "~/domain/digest-chart";
import { composeDigestEmail, escapeHtml } from "~/domain/digest-email";
import { compileSchema, entrySchema, issueSchema, letterSchema } from "~/domain/digest-forms";

// Invented taxonomy order for the checks (the demo class's systems, content-seed/taxonomy.yaml).
const ORDER = ["electrical", "joinery", "trim", "plumbing", "deck-hardware"];

describe("arranging the year's write-ups", () => {
  it("lists a write-up under its first system in the taxonomy's order, or under Other work", () => {
    expect(sectionFor(["joinery", "electrical"], ORDER)).toBe("electrical");
    expect(sectionFor(["deck-hardware"], ORDER)).toBe("deck-hardware");
    expect(sectionFor(["unknown", "trim"], ORDER)).toBe("trim");
    expect(sectionFor([], ORDER)).toBe(UNFILED_SECTION.slug);
  });

  it("starts by section, then oldest first, numbered in that order", () => {
    const entries = initialArrangement([
      { writeupId: 1, systems: ["joinery"], publishedAt: "2025-06-01T00:00:00Z" },
      { writeupId: 2, systems: ["electrical", "joinery"], publishedAt: "2025-09-01T00:00:00Z" },
      { writeupId: 3, systems: ["joinery"], publishedAt: "2025-02-01T00:00:00Z" },
      { writeupId: 4, systems: [], publishedAt: "2025-01-01T00:00:00Z" },
      { writeupId: 5, systems: ["electrical"], publishedAt: "2025-03-01T00:00:00Z" },
    ], ORDER);
    expect(entries.map((e) => [e.writeupId, e.sectionSlug, e.position])).toEqual([
      [5, "electrical", 0], [2, "electrical", 1], [3, "joinery", 2], [1, "joinery", 3], [4, "", 4],
    ]);
    expect(entries.every((e) => e.included)).toBe(true);
  });

  it("moves an entry within its section only, and renumbers every entry", () => {
    const start = initialArrangement([
      { writeupId: 1, systems: ["electrical"], publishedAt: "2025-01-01" },
      { writeupId: 2, systems: ["electrical"], publishedAt: "2025-02-01" },
      { writeupId: 3, systems: ["joinery"], publishedAt: "2025-03-01" },
    ], ORDER);
    const moved = moveEntry(start, 2, "up", ORDER)!;
    expect(orderedEntries(moved, ORDER).map((e) => e.writeupId)).toEqual([2, 1, 3]);
    expect(moved.map((e) => e.position).sort()).toEqual([0, 1, 2]);
    // First of its section, last of its section, not there: nothing to do.
    expect(moveEntry(start, 1, "up", ORDER)).toBeNull();
    expect(moveEntry(start, 2, "down", ORDER)).toBeNull(); // the next one is in another section
    expect(moveEntry(start, 3, "up", ORDER)).toBeNull();
    expect(moveEntry(start, 99, "down", ORDER)).toBeNull();
    // Moving down and up again is where it started.
    expect(orderedEntries(moveEntry(moveEntry(start, 1, "down", ORDER)!, 1, "up", ORDER)!, ORDER).map((e) => e.writeupId)).toEqual([1, 2, 3]);
  });

  it("groups what is in under section names, leaving out what was left out", () => {
    const entries = [
      { writeupId: 1, sectionSlug: "joinery", position: 1, included: true },
      { writeupId: 2, sectionSlug: "electrical", position: 0, included: true },
      { writeupId: 3, sectionSlug: "joinery", position: 2, included: false },
      { writeupId: 4, sectionSlug: "", position: 3, included: true },
    ];
    const groups = groupIntoSections(entries, [{ slug: "electrical", name: "Electrical" }, { slug: "joinery", name: "Joinery" }, { ...UNFILED_SECTION }]);
    expect(groups.map((g) => [g.name, g.entries.map((e) => e.writeupId)])).toEqual([["Electrical", [2]], ["Joinery", [1]], ["Other work", [4]]]);
  });

  it("will not issue an empty digest, nor a correction without a note", () => {
    expect(issueProblems({ edition: 1, included: 3, correctionNote: "" })).toEqual([]);
    expect(issueProblems({ edition: 1, included: 0, correctionNote: "" })).toHaveLength(1);
    expect(issueProblems({ edition: 2, included: 3, correctionNote: "  " })[0]).toMatch(/correction note/);
    expect(issueProblems({ edition: 2, included: 3, correctionNote: "Hull 402's entry named the wrong berth." })).toEqual([]);
  });
});

describe("small rules", () => {
  it("finds the first photo of our own store as the thumbnail, nothing else", () => {
    const key = "photos/2025/abcdefghijklmnopqrstuv";
    expect(firstPhotoThumbnail(`Text\n\n![The box, lid off](/media/${key}.webp)\n\n![b](/media/photos/2025/BBBBBBBBBBBBBBBBBBBBBB.webp)`))
      .toEqual({ key: `${key}.thumb.webp`, alt: "The box, lid off" });
    expect(firstPhotoThumbnail(`![x](/media/${key}.thumb.webp "title")`)).toEqual({ key: `${key}.thumb.webp`, alt: "x" });
    expect(firstPhotoThumbnail("![x](https://elsewhere.example/a.webp)")).toBeNull();
    expect(firstPhotoThumbnail("![x](/media/../secrets.webp)")).toBeNull();
    expect(firstPhotoThumbnail("no photo at all")).toBeNull();
  });

  it("splits recipients into batches in order", () => {
    expect(inBatches([1, 2, 3, 4, 5, 6, 7], 3)).toEqual([[1, 2, 3], [4, 5, 6], [7]]);
    expect(inBatches([], 3)).toEqual([]);
    expect(() => inBatches([1], 0)).toThrow(RangeError);
  });

  it("names editions and files plainly, and dates in UTC", () => {
    expect(digestTitle(2025)).toBe("Yearly digest 2025");
    expect(digestTitle(2025, 2)).toBe("Yearly digest 2025, edition 2");
    expect(digestFileName("Brantwater 22", 2025, 1)).toBe("brantwater-22-digest-2025.pdf");
    expect(digestFileName("Brantwater 22", 2025, 3)).toBe("brantwater-22-digest-2025-edition-3.pdf");
    // 23:30 on 31 December UTC is still that year, whatever the server's zone.
    expect(formatDigestDate("2025-12-31T23:30:00Z")).toBe("31 December 2025");
  });
});

describe("the chart of write-ups per system", () => {
  it("uses 1, 2 or 5 times a power of ten between grid lines", () => {
    // The "nice numbers" labelling rule for graph axes (P. S. Heckbert, "Nice numbers for graph
    // labels", Graphics Gems, 1990): steps of 1, 2 and 5 times a power of ten.
    expect([1, 2, 4, 5, 7, 12, 40, 99, 230, 1800].map((m) => niceStep(m))).toEqual([1, 1, 1, 1, 2, 5, 10, 20, 50, 500]);
  });

  it("scales the longest bar to the plot and keeps empty systems in place", () => {
    const chart = layoutBarChart([{ label: "Electrical", count: 4 }, { label: "Joinery", count: 0 }, { label: "Trim", count: 2 }], { width: 400, labelWidth: 100, countWidth: 20 });
    expect(chart.plotWidth).toBe(280);
    expect(chart.bars.map((b) => b.barWidth)).toEqual([280, 0, 140]);
    expect(chart.bars.map((b) => b.label)).toEqual(["Electrical", "Joinery", "Trim"]);
    expect(chart.ticks.map((t) => t.value)).toEqual([0, 1, 2, 3, 4]);
    expect(chart.ticks.at(-1)!.x).toBe(100 + 280);
    expect(layoutBarChart([{ label: "None", count: 0 }]).bars[0].barWidth).toBe(0);
  });
});

describe("the e-mail", () => {
  const snapshot: DigestSnapshot = {
    year: 2025, edition: 1, issuedAt: "2026-01-12T10:00:00Z",
    letterMarkdown: "Dear members,\n\nA **good** year.", letterHtml: "<p>Dear members,</p><p>A <strong>good</strong> year.</p>",
    correctionNote: "",
    figures: { writeupsPublished: 3, perSystem: [], spacesMeasured: 2, measurementsAdded: 5, mostDoneToo: [], newMembers: 1 },
    sections: [{
      slug: "electrical", name: "Electrical", entries: [{
        writeupId: 1, slug: "battery-box", title: `Battery box <script>alert("x")</script> & "lid"`, credit: "Ann B., hull 147",
        hullNumber: 147, boatName: "Tern Light", summary: "A vented, strapped box.", publishedAt: "2025-05-14T00:00:00Z",
        systems: ["Electrical"], thumbnailKey: null, thumbnailAlt: "", measurements: [], doneToo: 0,
      }],
    }],
  };
  const links = {
    web: "https://sistership.example/digest/2025", pdf: "https://sistership.example/digest/2025/pdf",
    unsubscribe: "https://sistership.example/digest/unsubscribe?token=7.abc", account: "https://sistership.example/account",
    writeup: (slug: string) => `https://sistership.example/writeups/${slug}`,
  };

  it("has the titles, the figures and the member's own unsubscribe link in both parts", () => {
    const mail = composeDigestEmail(snapshot, "Brantwater 22", links);
    expect(mail.subject).toBe("Brantwater 22 yearly digest 2025");
    expect(mail.text).toContain("3 write-ups published (1 in this digest)");
    expect(mail.text).toContain("https://sistership.example/writeups/battery-box");
    expect(mail.text).toContain(`To stop receiving it: ${links.unsubscribe}`);
    expect(mail.html).toContain(`href="${links.unsubscribe}"`);
    // Credit lines do not repeat the hull the member already gave.
    expect(mail.text).toContain("(Ann B., hull 147, Tern Light)");
  });

  it("escapes what members wrote in the HTML part (OWASP XSS Prevention Cheat Sheet, rule 1)", () => {
    const mail = composeDigestEmail(snapshot, "Brantwater 22", links);
    expect(mail.html).not.toContain("<script>");
    expect(mail.html).toContain("Battery box &lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &quot;lid&quot;");
    expect(escapeHtml(`<a href='x'>&</a>`)).toBe("&lt;a href=&#39;x&#39;&gt;&amp;&lt;/a&gt;");
  });

  it("says when it is a correction", () => {
    const mail = composeDigestEmail({ ...snapshot, edition: 2, correctionNote: "The stanchion entry named the wrong hull." }, "Brantwater 22", links);
    expect(mail.subject).toBe("Brantwater 22 yearly digest 2025, edition 2 (a correction)");
    expect(mail.text).toContain("Correction: The stanchion entry named the wrong hull.");
  });
});

describe("the secretary's forms", () => {
  it("takes a four-digit year in the class's lifetime", () => {
    expect(compileSchema.safeParse({ year: "2025" }).success).toBe(true);
    expect(compileSchema.safeParse({ year: "1970" }).success).toBe(false); // before the first hull (1971, the demo class)
    expect(compileSchema.safeParse({ year: "20x5" }).success).toBe(false);
  });

  it("needs the deliberate tick to issue, and reads the e-mail box", () => {
    expect(issueSchema.safeParse({ sendEmail: "on" }).success).toBe(false);
    expect(issueSchema.parse({ confirm: "on", sendEmail: "on" })).toEqual({ confirm: "on", sendEmail: true });
    expect(issueSchema.parse({ confirm: "on" })).toEqual({ confirm: "on", sendEmail: false });
  });

  it("bounds the letter and knows the entry changes", () => {
    expect(letterSchema.safeParse({ letter: "x".repeat(20_001) }).success).toBe(false);
    expect(letterSchema.parse({ letter: "Hello", correctionNote: "  fixed  " })).toEqual({ letter: "Hello", correctionNote: "fixed" });
    expect(entrySchema.safeParse({ intent: "sideways", writeupId: "1" }).success).toBe(false);
    expect(entrySchema.parse({ intent: "leave-out", writeupId: "12" })).toEqual({ intent: "leave-out", writeupId: 12 });
  });
});
