// Checks that warn the author and the moderator before a write-up is published.

/**
 * An electrical write-up that talks about a battery or a cable but never mentions a fuse or a
 * breaker: overcurrent protection close to the source is required for such circuits
 * (33 CFR 183.455; ABYC E-11).
 */
export function missingOvercurrentProtection(systems: readonly string[], text: string): boolean {
  if (!systems.includes("electrical")) return false;
  const t = text.toLowerCase();
  const aboutPower = /\bbatter(y|ies)\b|\bcables?\b|\bwir(e|es|ing)\b|\bconductors?\b/.test(t);
  const protectedBy = /\bfuse[sd]?\b|\bfusing\b|\bbreakers?\b|\bovercurrent\b|\bcircuit[- ]breakers?\b/.test(t);
  return aboutPower && !protectedBy;
}

export type Warning = { key: string; text: string };

export function writeupWarnings(input: { systems: readonly string[]; title: string; summary: string; body: string }): Warning[] {
  const all = `${input.title}\n${input.summary}\n${input.body}`;
  const warnings: Warning[] = [];
  if (missingOvercurrentProtection(input.systems, all)) {
    warnings.push({
      key: "overcurrent",
      text: "This electrical write-up mentions a battery or a cable but no fuse or breaker. Say how the circuit is protected (33 CFR 183.455; ABYC E-11), close to the battery.",
    });
  }
  return warnings;
}
