#!/usr/bin/env node
// Generator of the invented demo region "Veldmoor Uplands Fire District (demo)".
//
// Everything this script writes is INVENTED: the region, its sites, their names, their
// coordinates and every number. It exists to demonstrate and test firephase, nothing else.
// Same seed => byte-identical files. Plain Node ESM, built-ins only.
//
// Usage: node demo-region/generate.mjs [--seed N] [--out DIR]
//   (default seed 20270310, default DIR = the folder of this script)
//
// Planted links (see README.md): warm ENSO and positive NAO raise the odds of a regional fire
// year, strong warm ENSO (>= 1.5) more so; AMO has a weak positive effect; PDO has none.

import { mkdirSync, writeFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

// ---------------------------------------------------------------------------------------------
// Command line
// ---------------------------------------------------------------------------------------------

const DEFAULT_SEED = 20270310;

function parseArgs(argv) {
  let seed = DEFAULT_SEED;
  let out = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < argv.length; i += 1) {
    const arg = argv[i];
    if (arg === "--seed") {
      const value = Number(argv[i + 1]);
      if (!Number.isSafeInteger(value)) throw new Error(`--seed needs an integer (found ${argv[i + 1]})`);
      seed = value;
      i += 1;
    } else if (arg === "--out") {
      if (argv[i + 1] === undefined) throw new Error("--out needs a folder");
      out = resolve(argv[i + 1]);
      i += 1;
    } else {
      throw new Error(`unknown argument ${arg} (expected --seed N or --out DIR)`);
    }
  }
  return { seed, out };
}

// ---------------------------------------------------------------------------------------------
// Seeded randomness: mulberry32 (32-bit state) and a Box–Muller normal
// ---------------------------------------------------------------------------------------------

function mulberry32(seed) {
  let state = seed >>> 0;
  return function next() {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random source with uniform, normal (Box–Muller, both values used), Poisson and helpers. */
function makeRandom(seed) {
  const uniform = mulberry32(seed);
  let spare = null;
  function normal() {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    let u1 = uniform();
    while (u1 <= 0) u1 = uniform();
    const u2 = uniform();
    const radius = Math.sqrt(-2 * Math.log(u1));
    spare = radius * Math.sin(2 * Math.PI * u2);
    return radius * Math.cos(2 * Math.PI * u2);
  }
  function between(low, high) {
    return low + (high - low) * uniform();
  }
  function integer(low, high) {
    return low + Math.floor(uniform() * (high - low + 1));
  }
  function poisson(mean) {
    if (mean < 40) {
      // Knuth's multiplication method.
      const limit = Math.exp(-mean);
      let count = 0;
      let product = uniform();
      while (product > limit) {
        count += 1;
        product *= uniform();
      }
      return count;
    }
    return Math.max(0, Math.round(mean + Math.sqrt(mean) * normal()));
  }
  return { uniform, normal, between, integer, poisson };
}

// Independent streams per component, so changing one part does not reshuffle the others.
function streamSeed(seed, label) {
  let hash = (seed ^ 0x9e3779b9) >>> 0;
  for (const char of label) {
    hash = Math.imul(hash ^ char.charCodeAt(0), 0x01000193) >>> 0;
  }
  return hash;
}

// ---------------------------------------------------------------------------------------------
// Helpers
// ---------------------------------------------------------------------------------------------

/**
 * Coefficients of the latent regional fire propensity (the planted links):
 *   z_t = 1.7·ENSO_t + 0.4·[ENSO_t ≥ 1.5] + 1.0·NAO_t/sd(NAO) + 0.45·AMO_t/sd(AMO) + 0·PDO_t + 0.7·ε_t
 *   P(regional fire year t) = logistic(−3.4 + z_t),   ε_t ~ N(0, 1) (regional weather)
 * NAO_t is the Dec–Mar mean of the monthly values (the season of the March year).
 */
const K = Object.freeze({ enso: 1.7, strong: 0.4, nao: 1.0, amo: 0.45, noise: 0.7, base: -3.4 });
const logistic = (x) => 1 / (1 + Math.exp(-x));

function meanOf(values) {
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

function sdOf(values) {
  const m = meanOf(values);
  let sum = 0;
  for (const v of values) sum += (v - m) ** 2;
  return Math.sqrt(sum / (values.length - 1));
}

/** Great-circle distance in km (haversine, mean Earth radius 6371 km). */
function distanceKm(a, b) {
  const rad = Math.PI / 180;
  const dLat = (b.latitude - a.latitude) * rad;
  const dLon = (b.longitude - a.longitude) * rad;
  const h =
    Math.sin(dLat / 2) ** 2 +
    Math.cos(a.latitude * rad) * Math.cos(b.latitude * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371 * Math.asin(Math.min(1, Math.sqrt(h)));
}

/** Point at a given distance (km) and bearing (radians from north) on a sphere. */
function destination(from, km, bearing) {
  const rad = Math.PI / 180;
  const angular = km / 6371;
  const lat1 = from.latitude * rad;
  const lon1 = from.longitude * rad;
  const lat2 = Math.asin(
    Math.sin(lat1) * Math.cos(angular) + Math.cos(lat1) * Math.sin(angular) * Math.cos(bearing),
  );
  const lon2 =
    lon1 +
    Math.atan2(
      Math.sin(bearing) * Math.sin(angular) * Math.cos(lat1),
      Math.cos(angular) - Math.sin(lat1) * Math.sin(lat2),
    );
  return { latitude: lat2 / rad, longitude: lon2 / rad };
}

const EOL = "\r\n"; // RFC 4180 line break

/** One CSV field: quoted only when it holds a comma, quote or line break (RFC 4180). */
function csvField(value) {
  const text = value === null || value === undefined ? "" : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

function csv(header, rows) {
  return [header, ...rows].map((row) => row.map(csvField).join(",")).join(EOL) + EOL;
}

const fixed = (value, digits) => (value === null ? "" : value.toFixed(digits));

// ---------------------------------------------------------------------------------------------
// The invented region
// ---------------------------------------------------------------------------------------------

const REGION_NAME = "Veldmoor Uplands Fire District (demo)";
const FIRST_SIM_YEAR = 1480; // climate is simulated from here (burn-in) …
const FIRST_INDEX_YEAR = 1600; // … and written from here
const LAST_INDEX_YEAR = 2026; // indices.csv ends here; 2027 comes from the outlook
const OUTLOOK_SEASON = 2027;
const MODERN_FIRST = 1950;
const MODERN_LAST = 2025;
// Invented box, about 330 km × 330 km. The numbers describe no surveyed place.
const BOX = { south: 47.5, north: 50.5, west: 66.0, east: 70.6 };
const SITE_COUNT = 30;
const CLOSE_PAIR_KM = [14, 22]; // the one pair of sites closer than 40 km
const MIN_SPACING_KM = 44; // every other pair is further apart than this

// Made-up site names: invented words plus a plain landform word.
const SITE_NAMES = [
  "Orvane Ridge", "Callith Bench", "Morrakeld Flat", "Tessary Knob", "Bramwithe Draw",
  "Quillon Saddle", "Harnel Spur", "Dovrin Basin", "Elsket Ridge", "Fandrovel Flat",
  "Gorrath Bench", "Ivelthe Knob", "Jastry Draw", "Kelvane Saddle", "Lumsarry Spur",
  "Merrowan Basin", "Nethick Ridge", "Ossavell Flat", "Pellimar Bench", "Rundavel Knob",
  "Skarrow Draw", "Thistane Saddle", "Ulvering Spur", "Varrisk Basin", "Wenlithe Ridge",
  "Yarrivane Flat", "Zennick Bench", "Ardovane Knob", "Briskavel Draw", "Corvessa Saddle",
];

// ---------------------------------------------------------------------------------------------
// Climate indices
// ---------------------------------------------------------------------------------------------

/**
 * ENSO-like series: AR(2) x_t = 0.35 x_{t-1} − 0.40 x_{t-2} + e_t, whose complex roots give a
 * quasi-cycle of about 4.9 years (3–7-year band) with lag-1 autocorrelation about 0.25; scaled
 * to a standard deviation of 0.95.
 */
function simulateEnso(random, years) {
  const raw = [];
  let previous = 0;
  let beforePrevious = 0;
  for (let i = 0; i < years.length; i += 1) {
    const value = 0.35 * previous - 0.4 * beforePrevious + random.normal();
    raw.push(value);
    beforePrevious = previous;
    previous = value;
  }
  const scale = 0.95 / sdOf(raw);
  const m = meanOf(raw);
  return raw.map((v) => (v - m) * scale);
}

/** Multidecadal series: a slow sinusoid plus an AR(1) with strong persistence, then scaled. */
function simulateMultidecadal(random, years, { period, persistence, sinusoidShare, sd }) {
  const phase = random.between(0, 2 * Math.PI);
  const noise = [];
  let previous = 0;
  for (let i = 0; i < years.length; i += 1) {
    previous = persistence * previous + Math.sqrt(1 - persistence ** 2) * random.normal();
    noise.push(previous);
  }
  // Period drifts a little so the cycle is not a clean sine.
  const raw = years.map((year, i) => {
    const drift = 1 + 0.15 * Math.sin((2 * Math.PI * (year - years[0])) / 311);
    const wave = Math.SQRT2 * Math.sin((2 * Math.PI * (year - years[0])) / (period * drift) + phase);
    return Math.sqrt(sinusoidShare) * wave + Math.sqrt(1 - sinusoidShare) * (noise[i] ?? 0);
  });
  const scale = sd / sdOf(raw);
  const m = meanOf(raw);
  return raw.map((v) => (v - m) * scale);
}

/**
 * Monthly NAO-like values: nearly white (month-to-month AR(1) 0.1, standard deviation about 1),
 * with a small seasonal persistence so the Dec–Mar mean carries the signal used below.
 * Returns rows { year, month, value } from Dec of FIRST_INDEX_YEAR − 1 to Mar of OUTLOOK_SEASON.
 */
function simulateNaoMonthly(random) {
  const rows = [];
  let previous = 0;
  for (let year = FIRST_SIM_YEAR - 1; year <= OUTLOOK_SEASON; year += 1) {
    for (let month = 1; month <= 12; month += 1) {
      if (year === OUTLOOK_SEASON && month > 3) break;
      previous = 0.1 * previous + Math.sqrt(1 - 0.01) * random.normal();
      rows.push({ year, month, value: Math.round(previous * 100) / 100 });
    }
  }
  return rows;
}

/** Dec–Mar mean belonging to the year of March; null when a month is missing. */
function naoSeason(monthly, season) {
  const wanted = [
    [season - 1, 12],
    [season, 1],
    [season, 2],
    [season, 3],
  ];
  const values = wanted.map(([y, m]) => monthly.get(`${y}-${m}`));
  if (values.some((v) => v === undefined || v === null)) return null;
  return meanOf(values);
}

// ---------------------------------------------------------------------------------------------
// Sites
// ---------------------------------------------------------------------------------------------

function placeSites(random) {
  for (let attempt = 0; attempt < 200; attempt += 1) {
    const points = [];
    let tries = 0;
    while (points.length < SITE_COUNT - 1 && tries < 20000) {
      tries += 1;
      const candidate = {
        latitude: random.between(BOX.south, BOX.north),
        longitude: random.between(BOX.west, BOX.east),
      };
      if (points.every((p) => distanceKm(p, candidate) > MIN_SPACING_KM)) points.push(candidate);
    }
    if (points.length < SITE_COUNT - 1) continue;
    // One deliberate close pair: a companion within CLOSE_PAIR_KM of one site, far from all others.
    const anchorIndex = random.integer(0, points.length - 1);
    const anchor = points[anchorIndex];
    for (let k = 0; k < 400; k += 1) {
      const companion = destination(
        anchor,
        random.between(CLOSE_PAIR_KM[0], CLOSE_PAIR_KM[1]),
        random.between(0, 2 * Math.PI),
      );
      const inBox =
        companion.latitude > BOX.south &&
        companion.latitude < BOX.north &&
        companion.longitude > BOX.west &&
        companion.longitude < BOX.east;
      const farFromOthers = points.every(
        (p, i) => i === anchorIndex || distanceKm(p, companion) > MIN_SPACING_KM,
      );
      if (inBox && farFromOthers) {
        // Put the companion right after its anchor so the pair reads naturally in the file.
        points.splice(anchorIndex + 1, 0, companion);
        return points;
      }
    }
  }
  throw new Error("could not place the sites; widen the box");
}

/**
 * Recording spans: sample depth falls back in time — a few sites before 1700, most from about
 * 1750, a couple starting in the 1800s; most are sampled between 1998 and 2024, a few end early
 * (a stump that burned, a tree that died).
 */
function siteSpans(random) {
  const firsts = [];
  const plan = [
    [2, 1552, 1610],
    [3, 1611, 1660],
    [4, 1661, 1699],
    [12, 1700, 1749],
    [6, 1750, 1790],
    [3, 1800, 1865],
  ];
  for (const [count, low, high] of plan) {
    for (let i = 0; i < count; i += 1) firsts.push(random.integer(low, high));
  }
  // Shuffle so that ids are not ordered by age (Fisher–Yates).
  for (let i = firsts.length - 1; i > 0; i -= 1) {
    const j = random.integer(0, i);
    [firsts[i], firsts[j]] = [firsts[j], firsts[i]];
  }
  const earlyEnds = new Set();
  while (earlyEnds.size < 4) earlyEnds.add(random.integer(0, SITE_COUNT - 1));
  return firsts.map((first, i) => {
    const last = earlyEnds.has(i)
      ? random.integer(Math.max(first + 120, 1860), 1988)
      : random.integer(1998, 2024);
    return { first, last };
  });
}

// ---------------------------------------------------------------------------------------------
// Main
// ---------------------------------------------------------------------------------------------

function generate(seed) {
  const climateYears = [];
  for (let y = FIRST_SIM_YEAR; y <= OUTLOOK_SEASON; y += 1) climateYears.push(y);
  const at = (year) => year - FIRST_SIM_YEAR;

  // --- climate -------------------------------------------------------------------------------
  const enso = simulateEnso(makeRandom(streamSeed(seed, "enso")), climateYears);
  const amo = simulateMultidecadal(makeRandom(streamSeed(seed, "amo")), climateYears, {
    period: 64,
    persistence: 0.85,
    sinusoidShare: 0.45,
    sd: 0.2,
  });
  const pdo = simulateMultidecadal(makeRandom(streamSeed(seed, "pdo")), climateYears, {
    period: 47,
    persistence: 0.7,
    sinusoidShare: 0.35,
    sd: 0.95,
  });
  const naoRows = simulateNaoMonthly(makeRandom(streamSeed(seed, "nao")));

  // The outlook winter: warm ENSO and a clearly positive Dec–Mar NAO.
  enso[at(OUTLOOK_SEASON)] = 1.3;
  const outlookNaoTarget = 0.72;
  const outlookMonths = naoRows.filter(
    (r) => (r.year === OUTLOOK_SEASON - 1 && r.month === 12) || (r.year === OUTLOOK_SEASON && r.month <= 3),
  );
  const shift = Math.round((outlookNaoTarget - meanOf(outlookMonths.map((r) => r.value))) * 100) / 100;
  for (const r of outlookMonths) r.value = Math.round((r.value + shift) * 100) / 100;
  // Make the four months' mean exactly the target (to the cent) by adjusting March.
  const lastMonth = outlookMonths[outlookMonths.length - 1];
  const others = outlookMonths.slice(0, -1).reduce((s, r) => s + Math.round(r.value * 100), 0);
  lastMonth.value = (Math.round(outlookNaoTarget * 400) - others) / 100;

  // One missing month early on, so one NAO season is missing (reader warning).
  const missingNao = { year: 1652, month: 1 };
  const naoMonthly = new Map();
  for (const r of naoRows) {
    const missing = r.year === missingNao.year && r.month === missingNao.month;
    naoMonthly.set(`${r.year}-${r.month}`, missing ? null : r.value);
  }
  const naoSeasonal = climateYears.map((y) => naoSeason(naoMonthly, y));
  const naoSd = sdOf(naoSeasonal.filter((v) => v !== null));

  // --- latent regional fire propensity ---------------------------------------------------------
  // z_t and P(regional fire year) as documented at K (PDO deliberately absent).
  const amoSd = sdOf(amo);
  const weather = makeRandom(streamSeed(seed, "weather"));
  const latent = climateYears.map((year, i) => {
    const e = enso[i] ?? 0;
    const n = naoSeasonal[i] === null ? 0 : (naoSeasonal[i] ?? 0) / naoSd;
    const a = (amo[i] ?? 0) / amoSd;
    return K.enso * e + K.strong * (e >= 1.5 ? 1 : 0) + K.nao * n + K.amo * a + K.noise * weather.normal();
  });
  const regionalDraws = makeRandom(streamSeed(seed, "regional"));
  const regional = latent.map((z) => regionalDraws.uniform() < logistic(K.base + z));
  const severity = latent.map((z) => Math.min(0.85, Math.max(0.25, 0.5 + 0.08 * z + 0.12 * regionalDraws.normal())));

  // --- sites and fire-scar events -------------------------------------------------------------
  const siteRandom = makeRandom(streamSeed(seed, "sites"));
  const points = placeSites(siteRandom);
  const spans = siteSpans(siteRandom);
  const sites = points.map((p, i) => ({
    id: `S${String(i + 1).padStart(2, "0")}`,
    name: SITE_NAMES[i],
    latitude: p.latitude,
    longitude: p.longitude,
    firstYear: spans[i].first,
    lastYear: spans[i].last,
    proneness: siteRandom.between(0.7, 1.3),
  }));

  const fireRandom = makeRandom(streamSeed(seed, "fires"));
  const events = [];
  for (const site of sites) {
    for (let year = site.firstYear; year <= site.lastYear; year += 1) {
      const i = at(year);
      const z = latent[i] ?? 0;
      const chance = regional[i]
        ? Math.min(0.95, (severity[i] ?? 0.5) * site.proneness)
        : Math.min(0.2, 0.03 * site.proneness * Math.exp(0.3 * z));
      if (fireRandom.uniform() < chance) events.push({ site: site.id, year });
    }
  }

  // --- modern agency fire records (1950–2025) -------------------------------------------------
  const modernRandom = makeRandom(streamSeed(seed, "modern"));
  const modern = [];
  for (let year = MODERN_FIRST; year <= MODERN_LAST; year += 1) {
    const i = at(year);
    const z = latent[i] ?? 0;
    // Detection and reporting improve until about 1985, then level off.
    const reporting = 0.55 + 0.45 * Math.min(1, (year - MODERN_FIRST) / 35);
    const meanFires = 110 * reporting * Math.exp(0.28 * z + (regional[i] ? 0.45 : 0));
    const fires = modernRandom.poisson(meanFires);
    const logArea =
      Math.log(2600) + 0.55 * z + (regional[i] ? 1.5 : 0) + 0.55 * modernRandom.normal();
    const area = fires === 0 ? 0 : Math.max(1, Math.round(Math.exp(logArea) * reporting));
    modern.push({ year, fires, area });
  }

  // --- index tables ---------------------------------------------------------------------------
  const missingCells = new Set(["ENSO:1611", "ENSO:1647", "AMO:1628", "AMO:1803", "PDO:1606", "PDO:1871"]);
  const indexRows = [];
  for (let year = FIRST_INDEX_YEAR; year <= LAST_INDEX_YEAR; year += 1) {
    const i = at(year);
    const cell = (name, series, digits) =>
      missingCells.has(`${name}:${year}`) ? "" : fixed(series[i] ?? 0, digits);
    indexRows.push([year, cell("ENSO", enso, 2), cell("AMO", amo, 3), cell("PDO", pdo, 2)]);
  }
  const naoCsvRows = naoRows
    .filter((r) => r.year > FIRST_INDEX_YEAR - 1 || (r.year === FIRST_INDEX_YEAR - 1 && r.month === 12))
    .map((r) => {
      const value = naoMonthly.get(`${r.year}-${r.month}`);
      return [r.year, r.month, value === null || value === undefined ? "" : value.toFixed(2)];
    });

  const outlookNao = naoSeason(naoMonthly, OUTLOOK_SEASON);

  const region = {
    name: REGION_NAME,
    description:
      "An INVENTED region with GENERATED data (demo-region/generate.mjs, seed " +
      `${seed}) for demonstrating and testing firephase only. No site, name, coordinate or value ` +
      "describes a real place or a real record.",
    calibration: { first: 1700, last: 1990 },
    fireRecord: { sites: "fire-sites.csv", events: "fire-events.csv", modern: "modern-fires.csv" },
    fireYears: { top: 0.1, measure: "fraction", minSitesRecording: 3 },
    indices: {
      ENSO: { file: "indices.csv", column: "ENSO", cuts: [-0.5, 0.5], labels: ["cold", "neutral", "warm"] },
      NAO: {
        file: "nao-monthly.csv",
        column: "NAO",
        months: "Dec-Mar",
        phases: "terciles",
        labels: ["negative", "neutral", "positive"],
      },
      AMO: { file: "indices.csv", column: "AMO", phases: "terciles", labels: ["cool", "neutral", "warm"] },
      PDO: { file: "indices.csv", column: "PDO", cuts: [-0.5, 0.5], labels: ["cool", "neutral", "warm"] },
    },
    outlook: {
      season: OUTLOOK_SEASON,
      values: {
        ENSO: Number((enso[at(OUTLOOK_SEASON)] ?? 0).toFixed(2)),
        NAO: Number((outlookNao ?? 0).toFixed(2)),
        AMO: Number((amo[at(OUTLOOK_SEASON)] ?? 0).toFixed(3)),
        PDO: Number((pdo[at(OUTLOOK_SEASON)] ?? 0).toFixed(2)),
      },
      issued: "2027-03-10",
    },
    seed: 2027,
    methods: { interval: "wilson", analogs: 10, independenceKm: 40 },
  };

  events.sort((a, b) => (a.site < b.site ? -1 : a.site > b.site ? 1 : a.year - b.year));

  return {
    "region.json": JSON.stringify(region, null, 2) + "\n",
    "fire-sites.csv": csv(
      ["site", "latitude", "longitude", "first_year", "last_year", "name"],
      sites.map((s) => [s.id, s.latitude.toFixed(4), s.longitude.toFixed(4), s.firstYear, s.lastYear, s.name]),
    ),
    "fire-events.csv": csv(
      ["site", "year"],
      events.map((e) => [e.site, e.year]),
    ),
    "modern-fires.csv": csv(
      ["year", "fires", "area_ha"],
      modern.map((m) => [m.year, m.fires, m.area]),
    ),
    "indices.csv": csv(["year", "ENSO", "AMO", "PDO"], indexRows),
    "nao-monthly.csv": csv(["year", "month", "NAO"], naoCsvRows),
  };
}

const { seed, out } = parseArgs(process.argv.slice(2));
const files = generate(seed);
mkdirSync(out, { recursive: true });
for (const [name, text] of Object.entries(files)) {
  writeFileSync(join(out, name), text, "utf8");
}
process.stdout.write(`demo region written to ${out} (seed ${seed}): ${Object.keys(files).join(", ")}\n`);
