/**
 * Invented regions for property tests (never a real record): an already composited activity
 * record and yearly index series drawn from a seeded generator, with a planted link of chosen
 * strength between index "A" and fire activity. Index "B" is pure noise.
 */
import { createRandom } from "../../src/stats/createRandom.js";
import { DEFAULT_FIRE_YEARS, DEFAULT_METHODS } from "../../src/workspace/defaults.js";
import type { IndexSettings, MethodSettings, Workspace } from "../../src/workspace/types.js";

export interface SyntheticOptions {
  readonly first?: number;
  readonly last?: number;
  /** Logistic slope of fire-year odds on index A (0 = no link). */
  readonly effect?: number;
  readonly seed?: number;
  readonly sites?: number;
  readonly methods?: Partial<MethodSettings>;
  readonly values?: Record<string, number>;
}

function normal(random: ReturnType<typeof createRandom>): number {
  const u = Math.max(random.nextFloat(), 1e-12);
  const v = random.nextFloat();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

export function syntheticWorkspace(options: SyntheticOptions = {}): Workspace {
  const first = options.first ?? 1701;
  const last = options.last ?? 1990;
  const effect = options.effect ?? 0;
  const sites = options.sites ?? 20;
  const random = createRandom(options.seed ?? 7);
  const years: number[] = [];
  const a: number[] = [];
  const b: number[] = [];
  const rows: { year: number; sitesRecording: number; sitesBurned: number }[] = [];
  for (let year = first; year <= last; year += 1) {
    const indexA = normal(random);
    const indexB = normal(random);
    years.push(year);
    a.push(indexA);
    b.push(indexB);
    const logit = -2.5 + effect * indexA;
    const regional = random.nextFloat() < 1 / (1 + Math.exp(-logit));
    const perSite = regional ? 0.6 : 0.03;
    let burned = 0;
    for (let site = 0; site < sites; site += 1) if (random.nextFloat() < perSite) burned += 1;
    rows.push({ year, sitesRecording: sites, sitesBurned: burned });
  }
  const indexSettings: IndexSettings[] = [
    { name: "A", file: "indices.csv", column: "A", phases: { kind: "cuts", cuts: [-0.5, 0.5], labels: ["low", "mid", "high"] }, months: null },
    { name: "B", file: "indices.csv", column: "B", phases: { kind: "terciles", labels: ["low", "middle", "high"] }, months: null },
  ];
  return {
    root: "/synthetic",
    settings: {
      name: "Synthetic test region (invented)",
      description: null,
      calibration: null,
      fireYears: DEFAULT_FIRE_YEARS,
      indices: indexSettings,
      outlook: { season: 2027, values: options.values ?? { A: 1.2, B: 0 }, issued: "2027-03-10" },
      seed: options.seed ?? 7,
      methods: { ...DEFAULT_METHODS, seaDraws: 2000, ...options.methods },
    },
    fireRecord: { kind: "activity", rows },
    modern: null,
    indices: [
      { name: "A", years, values: a },
      { name: "B", years, values: b },
    ],
    files: [],
    warnings: [],
  };
}

/** The same invented region with other fixed cuts (and labels) for index A. */
export function withCutsForA(workspace: Workspace, cuts: readonly number[], labels: readonly string[]): Workspace {
  return {
    ...workspace,
    settings: {
      ...workspace.settings,
      indices: workspace.settings.indices.map((index) => (index.name === "A" ? { ...index, phases: { kind: "cuts" as const, cuts, labels } } : index)),
    },
  };
}
