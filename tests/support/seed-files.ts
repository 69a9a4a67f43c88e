// Reads the demo content straight from content-seed/, so tests can count it independently of the seeder.
import fs from "node:fs";
import path from "node:path";
import YAML from "yaml";

export const SEED_DIR = path.resolve(import.meta.dirname, "../../content-seed");

export type SeedWriteup = { slug: string; title: string; status: string; systems: string[]; publishedAt?: string; body: string };

export function readSeedWriteups(): SeedWriteup[] {
  const dir = path.join(SEED_DIR, "writeups");
  return fs.readdirSync(dir).filter((f) => f.endsWith(".md")).map((file) => {
    const text = fs.readFileSync(path.join(dir, file), "utf8");
    const [, front, body] = text.split(/^---\s*$/m);
    const data = YAML.parse(front);
    return {
      slug: file.replace(/\.md$/, ""),
      title: data.title,
      status: data.status,
      systems: data.systems,
      publishedAt: data.publishedAt ? String(data.publishedAt instanceof Date ? data.publishedAt.toISOString() : data.publishedAt) : undefined,
      body,
    };
  });
}

export function readSeedYaml<T>(name: string): T {
  return YAML.parse(fs.readFileSync(path.join(SEED_DIR, name), "utf8")) as T;
}
