// The usual cautions for the kinds of work a write-up describes, keyed by boat system.
// Each names where it comes from; the product defers to the applicable standards, local codes
// and licensed professionals.

export type Caution = { key: string; title: string; text: string; source: string };

export const CAUTIONS: Record<string, Caution> = {
  battery: {
    key: "battery",
    title: "Batteries",
    text:
      "Charging lead-acid batteries give off hydrogen, which burns at about 4 % in air: ventilate the space and keep flames and sparks away. " +
      "Secure every battery so it cannot move more than 1 in when pulled with 90 lb or twice its weight, whichever is less; cover the terminals; never place a battery directly above or below a fuel tank. " +
      "Disconnect the negative terminal before working on the wiring.",
    source: "33 CFR 183.420 and 183.445; 29 CFR 1910.178(g)",
  },
  wiring: {
    key: "wiring",
    title: "Wiring",
    text:
      "Protect every conductor with a fuse or breaker close to its source of power. Its rating may never exceed what the conductor allows (150 % of its ampacity under 50 V); " +
      "within that ceiling, pick a rating at or just above what the load draws (common practice). " +
      "Undersized cable overheats; a short circuit at a battery can start a fire. Follow ABYC E-11 for DC systems, or have a qualified marine electrician do or check the work.",
    source: "33 CFR 183.455; ABYC E-11; the rating near the load's draw: common practice",
  },
  stability: {
    key: "stability",
    title: "Weight and stability",
    text:
      "Adding or moving weight changes how the boat heels and trims, and weight placed high reduces stability. " +
      "The figures in Sistership are estimates for small angles; for a large change, ask a naval architect or a qualified surveyor.",
    source: "Initial stability (inclining relation, ASTM F1321); common practice",
  },
  resins: {
    key: "resins",
    title: "Epoxy and resins",
    text:
      "Uncured epoxy resin and hardener are a leading cause of allergic skin reactions: wear nitrile gloves and eye protection, keep it off your skin, and ventilate the cabin.",
    source: "EU-OSHA OSHwiki, epoxy resins",
  },
  dust: {
    key: "dust",
    title: "Cutting and sanding fibreglass",
    text:
      "Cutting or sanding fibreglass makes fine, irritating dust: wear a NIOSH-approved respirator and eye protection, and use the power tool's guards.",
    source: "NIOSH recommended exposure limit for glass fibres (3 fibres/cm³)",
  },
  belowWaterline: {
    key: "belowWaterline",
    title: "Below the waterline",
    text:
      "A fitting below the waterline that fails can sink the boat: do this work hauled out, use fittings and hose rated for below-waterline use, and double-clamp hoses where the standard asks for it.",
    source: "ABYC H-27 (through-hull fittings); common practice",
  },
  aloft: {
    key: "aloft",
    title: "Rigging and working aloft",
    text:
      "A failed chainplate or fitting can bring the mast down. Inspect, do not guess; lower the mast with enough help, and have a rigger look at anything you are unsure of.",
    source: "Common practice",
  },
  road: {
    key: "road",
    title: "On the road",
    text: "Trailers must meet the lighting, braking and weight rules of the places you tow through; check the local codes.",
    source: "Local regulations",
  },
};

const BY_SYSTEM: Record<string, string[]> = {
  electrical: ["battery", "wiring"],
  trim: ["stability"],
  joinery: ["resins", "dust"],
  "hull-keel": ["resins", "dust", "belowWaterline"],
  plumbing: ["belowWaterline"],
  rigging: ["aloft"],
  "deck-hardware": ["resins", "dust"],
  "engine-outboard": ["stability"],
  trailer: ["road"],
};

/** The cautions that apply to a write-up tagged with these systems, each once, in a stable order. */
export function cautionsFor(systemSlugs: readonly string[]): Caution[] {
  const keys = new Set(systemSlugs.flatMap((slug) => BY_SYSTEM[slug] ?? []));
  return Object.values(CAUTIONS).filter((c) => keys.has(c.key));
}
