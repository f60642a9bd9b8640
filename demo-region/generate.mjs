#!/usr/bin/env node
// Generator of the invented demo region "Tarvessa Plateau Fire Zone (invented demo)".
//
// Everything this script writes is INVENTED: the region, its sites, their names, their
// coordinates, the indices PMI and WSI (and the values of the series called ENSO) and every
// number. It exists to demonstrate and test firephase, nothing else.
// Same seed => byte-identical files. Plain Node ESM, built-ins only.
//
// Usage: node demo-region/generate.mjs [--seed N] [--out DIR]
//   (default seed 20270310, default DIR = the folder of this script)
//
// Planted links (see README.md): a dry (NEGATIVE) Dec–Mar Plateau Moisture Index raises the odds
// of a regional fire year, the drier the more (a dose-response on the logit scale); a warm ENSO
// season raises the odds of fire in the FOLLOWING year (a one-year lag, no same-season effect);
// the Westerly Strength Index has no effect. Since 1950 the moisture link is planted 25 % stronger.

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
 *   z_t = −moisture_t · PMI_t / sd(PMI) + 0.95 · ENSO_{t−1} / sd(ENSO) + 0 · WSI_t + 0.55 · ε_t
 *   P(regional fire year t) = logistic(−3.05 + z_t),   ε_t ~ N(0, 1) (regional weather)
 * with moisture_t = 1.6 before 1950 and 1.6 × 1.25 = 2.0 from 1950 (the modern era).
 * PMI_t is the Dec–Mar mean of the monthly values (the season of the March year); ENSO_{t−1} is
 * the Dec–Feb mean of the season before (Dec of t−2 to Feb of t−1).
 */
const K = Object.freeze({ moisture: 1.6, modernFactor: 1.25, ensoLag: 0.95, wsi: 0, noise: 0.55, base: -3.05 });
const MODERN_ERA = 1950;
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

const round2 = (value) => Math.round(value * 100) / 100;

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

/** Wilson score interval (Wilson 1927) at 95 %, for the invented kept outlooks. */
function wilson(successes, trials) {
  if (trials === 0) return { estimate: null, lower: null, upper: null };
  const z = 1.959963984540054;
  const p = successes / trials;
  const denominator = 1 + (z * z) / trials;
  const centre = (p + (z * z) / (2 * trials)) / denominator;
  const half = (z * Math.sqrt((p * (1 - p)) / trials + (z * z) / (4 * trials * trials))) / denominator;
  return { estimate: p, lower: Math.max(0, centre - half), upper: Math.min(1, centre + half) };
}

/** Type-7 sample quantile (Hyndman & Fan 1996) of an ascending array. */
function quantile7(sorted, p) {
  const h = (sorted.length - 1) * p;
  const low = Math.floor(h);
  const high = Math.min(sorted.length - 1, low + 1);
  return sorted[low] + (h - low) * (sorted[high] - sorted[low]);
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

// ---------------------------------------------------------------------------------------------
// The invented region
// ---------------------------------------------------------------------------------------------

const REGION_NAME = "Tarvessa Plateau Fire Zone (invented demo)";
const FIRST_SIM_YEAR = 1480; // climate is simulated from here (burn-in) …
const FIRST_INDEX_YEAR = 1600; // … and written from here
const ISSUED = "2027-03-10"; // the demo's pinned issue date
const OUTLOOK_SEASON = 2027;
const LAST_MONTH = { year: 2027, month: 2 }; // index data run to the month before the issue date
const CALIBRATION = { first: 1720, last: 1990 };
const MODERN_FIRST = 1950;
const MODERN_LAST = 2026;
const KEPT_SEASONS = [2019, 2020, 2021, 2022, 2023, 2024, 2025, 2026];
const MISSING_CODE = -99.99;
// Invented box, about 265 km × 270 km on a dry interior plateau. The numbers describe no surveyed place.
const BOX = { south: 44.2, north: 46.6, west: 100.6, east: 104.0 };
const SITE_COUNT = 30;
const CLOSE_PAIR_KM = [17, 26]; // the one pair of sites closer than 40 km
const MIN_SPACING_KM = 42; // every other pair is further apart than this
const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

// Made-up site names: invented words plus a plain landform word.
const SITE_NAMES = [
  "Olbrek Mesa", "Tashindra Rim", "Vennico Table", "Harsulo Butte", "Quarnet Bench",
  "Ildrasse Rim", "Morvekka Table", "Sulventa Mesa", "Prannock Butte", "Wesseldru Bench",
  "Kastrivo Rim", "Ebbernell Mesa", "Fyrrolan Table", "Gostavry Butte", "Nimbrasse Bench",
  "Ustrelow Rim", "Zarkovine Mesa", "Brellidan Table", "Cossamire Butte", "Dravunel Bench",
  "Jorrisket Rim", "Lannovard Mesa", "Rethimba Table", "Tolvessin Butte", "Yskarrow Bench",
  "Aumbrella Rim", "Hestrovan Mesa", "Pellagrue Table", "Skorrinde Butte", "Vostremmel Bench",
];

// ---------------------------------------------------------------------------------------------
// Climate indices (monthly, from Jan FIRST_SIM_YEAR − 1 to LAST_MONTH)
// ---------------------------------------------------------------------------------------------

function monthRange() {
  const months = [];
  for (let year = FIRST_SIM_YEAR - 1; year <= LAST_MONTH.year; year += 1) {
    for (let month = 1; month <= 12; month += 1) {
      if (year === LAST_MONTH.year && month > LAST_MONTH.month) break;
      months.push({ year, month });
    }
  }
  return months;
}

/**
 * PMI (Plateau Moisture Index, INVENTED; standardized units, negative = dry): a year-to-year
 * component (AR(1), coefficient 0.2; a moisture year runs Oct–Sep) plus a month-to-month AR(1)
 * (coefficient 0.6); the Dec–Mar mean has a standard deviation of about 1.
 */
function simulatePmi(random, months) {
  const yearly = new Map();
  let previousYear = 0;
  for (let year = FIRST_SIM_YEAR - 1; year <= LAST_MONTH.year + 1; year += 1) {
    previousYear = 0.2 * previousYear + Math.sqrt(1 - 0.04) * random.normal();
    yearly.set(year, previousYear);
  }
  let previous = 0;
  return months.map(({ year, month }) => {
    previous = 0.6 * previous + Math.sqrt(1 - 0.36) * random.normal();
    // The moisture year runs Oct–Sep: Oct–Dec belong to the next year's component.
    const component = yearly.get(month >= 10 ? year + 1 : year) ?? 0;
    return 0.78 * component + 0.75 * previous;
  });
}

/**
 * ENSO-like values (the NAME is the well-known index; the VALUES are GENERATED here): one event
 * amplitude per ENSO year, independent from year to year (so no lag-1 persistence), peaking
 * Nov–Jan and fading through the following autumn, plus small monthly noise (AR(1), 0.5).
 */
function simulateEnso(random, months) {
  const events = new Map();
  for (let k = FIRST_SIM_YEAR - 1; k <= LAST_MONTH.year + 1; k += 1) events.set(k, random.normal());
  // Weight of the event of ENSO year k (peak Dec of k−1 … Feb of k) in each calendar month.
  const weight = [1.0, 0.95, 0.8, 0.6, 0.45, 0.35, 0.5, 0.65, 0.8, 0.9, 1.0, 1.0];
  let noise = 0;
  return months.map(({ year, month }) => {
    noise = 0.5 * noise + Math.sqrt(1 - 0.25) * random.normal();
    const k = month >= 6 ? year + 1 : year;
    return 0.85 * (events.get(k) ?? 0) * weight[month - 1] + 0.18 * noise;
  });
}

/** WSI (Westerly Strength Index, INVENTED; hPa anomaly): monthly AR(1), coefficient 0.3, sd 1.6 hPa. */
function simulateWsi(random, months) {
  let previous = 0;
  return months.map(() => {
    previous = 0.3 * previous + Math.sqrt(1 - 0.09) * random.normal();
    return 1.6 * previous;
  });
}

/** Mean of a window of months ending in `season` (lastMonth = 3 for Dec–Mar, 2 for Dec–Feb); null if any is missing. */
function windowMean(monthly, season, lastMonth) {
  const values = [[season - 1, 12]];
  for (let m = 1; m <= lastMonth; m += 1) values.push([season, m]);
  const found = values.map(([y, m]) => monthly.get(`${y}-${m}`));
  if (found.some((v) => v === undefined || v === null)) return null;
  return meanOf(found);
}

/** Shift the given months so that their mean is `target`, to the cent (the last month absorbs rounding). */
function pinMean(monthly, keys, target) {
  const values = keys.map((key) => monthly.get(key));
  const shift = round2(target - meanOf(values));
  const shifted = values.map((v) => round2(v + shift));
  const others = shifted.slice(0, -1).reduce((s, v) => s + Math.round(v * 100), 0);
  shifted[shifted.length - 1] = (Math.round(target * 100 * keys.length) - others) / 100;
  keys.forEach((key, i) => monthly.set(key, shifted[i]));
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
        points.splice(anchorIndex + 1, 0, companion);
        return points;
      }
    }
  }
  throw new Error("could not place the sites; widen the box");
}

/**
 * Recording spans: sample depth falls back in time — a few sites before 1700, most from the
 * 1700s, a few starting in the 1800s; most are sampled between 2003 and 2024, a few end early.
 */
function siteSpans(random) {
  const firsts = [];
  const plan = [
    [2, 1560, 1620],
    [3, 1621, 1680],
    [5, 1681, 1719],
    [11, 1720, 1769],
    [6, 1770, 1820],
    [3, 1821, 1880],
  ];
  for (const [count, low, high] of plan) {
    for (let i = 0; i < count; i += 1) firsts.push(random.integer(low, high));
  }
  for (let i = firsts.length - 1; i > 0; i -= 1) {
    const j = random.integer(0, i);
    [firsts[i], firsts[j]] = [firsts[j], firsts[i]];
  }
  const earlyEnds = new Set();
  while (earlyEnds.size < 4) earlyEnds.add(random.integer(0, SITE_COUNT - 1));
  return firsts.map((first, i) => {
    const last = earlyEnds.has(i)
      ? random.integer(Math.max(first + 120, 1880), 1975)
      : random.integer(2003, 2024);
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
  const months = monthRange();
  const key = (y, m) => `${y}-${m}`;

  // --- climate -------------------------------------------------------------------------------
  const toMap = (values) => new Map(months.map((m, i) => [key(m.year, m.month), round2(values[i])]));
  const pmiRaw = simulatePmi(makeRandom(streamSeed(seed, "pmi")), months);
  const pmi = toMap(pmiRaw);
  const enso = toMap(simulateEnso(makeRandom(streamSeed(seed, "enso")), months));
  const wsi = toMap(simulateWsi(makeRandom(streamSeed(seed, "wsi")), months));

  // The outlook spring: a clearly dry winter so far (Dec 2026 – Feb 2027 mean −1.65, March not
  // yet known on the issue date); a warm ENSO season the winter before (2026: +1.25), a near-
  // neutral one now (2027: −0.20).
  pinMean(pmi, [key(2026, 12), key(2027, 1), key(2027, 2)], -1.65);
  pinMean(enso, [key(2024, 12), key(2025, 1), key(2025, 2)], -0.35);
  pinMean(enso, [key(2025, 12), key(2026, 1), key(2026, 2)], 1.25);
  pinMean(enso, [key(2026, 12), key(2027, 1), key(2027, 2)], -0.2);

  // Missing months (written as -99.99 in the wide PMI file, empty cells in the long file).
  for (const [y, m] of [[1655, 2], [1804, 12]]) pmi.set(key(y, m), null);
  enso.set(key(1641, 1), null);

  const pmiSeason = climateYears.map((y) => windowMean(pmi, y, 3));
  const ensoSeason = climateYears.map((y) => windowMean(enso, y, 2));
  const wsiSeason = climateYears.map((y) => windowMean(wsi, y, 2));
  const present = (values) => values.filter((v) => v !== null);
  const pmiSd = sdOf(present(pmiSeason));
  const ensoSd = sdOf(present(ensoSeason));

  // --- latent regional fire propensity ---------------------------------------------------------
  const weather = makeRandom(streamSeed(seed, "weather"));
  const latent = climateYears.map((year, i) => {
    const moisture = K.moisture * (year >= MODERN_ERA ? K.modernFactor : 1);
    const p = pmiSeason[i] === null ? 0 : pmiSeason[i] / pmiSd;
    const e = i === 0 || ensoSeason[i - 1] === null ? 0 : ensoSeason[i - 1] / ensoSd;
    return -moisture * p + K.ensoLag * e + K.noise * weather.normal();
  });
  const regionalDraws = makeRandom(streamSeed(seed, "regional"));
  const regional = latent.map((z) => regionalDraws.uniform() < logistic(K.base + z));
  const severity = latent.map((z) => Math.min(0.85, Math.max(0.3, 0.52 + 0.07 * z + 0.12 * regionalDraws.normal())));

  // --- sites and fire-scar events -------------------------------------------------------------
  const siteRandom = makeRandom(streamSeed(seed, "sites"));
  const points = placeSites(siteRandom);
  const spans = siteSpans(siteRandom);
  const sites = points.map((p, i) => ({
    id: `T${String(i + 1).padStart(2, "0")}`,
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
        : Math.min(0.2, 0.03 * site.proneness * Math.exp(0.25 * z));
      if (fireRandom.uniform() < chance) events.push({ site: site.id, year });
    }
  }
  events.sort((a, b) => (a.site < b.site ? -1 : a.site > b.site ? 1 : a.year - b.year));

  // --- modern agency fire records (1950–2026) -------------------------------------------------
  const modernRandom = makeRandom(streamSeed(seed, "modern"));
  const modern = [];
  for (let year = MODERN_FIRST; year <= MODERN_LAST; year += 1) {
    const i = at(year);
    const z = latent[i] ?? 0;
    // Detection and reporting improve until about 1980, then level off.
    const reporting = 0.6 + 0.4 * Math.min(1, (year - MODERN_FIRST) / 30);
    const meanFires = 70 * reporting * Math.exp(0.25 * z + (regional[i] ? 0.5 : 0));
    const fires = modernRandom.poisson(meanFires);
    const logArea = Math.log(1400) + 0.5 * z + (regional[i] ? 1.6 : 0) + 0.5 * modernRandom.normal();
    const area = fires === 0 ? 0 : Math.max(1, Math.round(Math.exp(logArea) * reporting));
    modern.push({ year, fires, area });
  }

  // --- kept outlooks of past seasons (INVENTED examples from this model, not from the tool) ----
  const kept = keptOutlooks({ sites, events, pmi, enso, wsi, pmiSeason, ensoSeason, wsiSeason, at });

  // --- files ------------------------------------------------------------------------------------
  const wideRows = [];
  for (let year = FIRST_INDEX_YEAR; year <= LAST_MONTH.year; year += 1) {
    const row = [year];
    for (let month = 1; month <= 12; month += 1) {
      const value = pmi.get(key(year, month));
      row.push(value === undefined || value === null ? MISSING_CODE.toFixed(2) : value.toFixed(2));
    }
    wideRows.push(row);
  }
  const longRows = months
    .filter((m) => m.year > FIRST_INDEX_YEAR - 1 || (m.year === FIRST_INDEX_YEAR - 1 && m.month === 12))
    .map(({ year, month }) => {
      const cell = (map) => {
        const value = map.get(key(year, month));
        return value === undefined || value === null ? "" : value.toFixed(2);
      };
      return [year, month, cell(enso), cell(wsi)];
    });

  const region = {
    name: REGION_NAME,
    description:
      "An INVENTED region with GENERATED data (demo-region/generate.mjs, seed " +
      `${seed}) for demonstrating and testing firephase only. No site, name, coordinate or value ` +
      "describes a real place or a real record; PMI and WSI are invented indices and the ENSO values are generated.",
    preparedBy: "Demo desk (invented), firephase demo region",
    contact: "demo-desk@example.invalid (invented address, not monitored)",
    calibration: CALIBRATION,
    fireRecord: { sites: "fire-sites.csv", events: "fire-events.csv", modern: "modern-fires.csv" },
    fireYears: { top: 0.1, measure: "fraction", minSitesRecording: 3 },
    indices: {
      PMI: {
        file: "pmi-monthly.csv",
        column: "PMI",
        months: "Dec-Mar",
        missing: [MISSING_CODE],
        units: "standardized (invented index)",
        cuts: [-0.5, 0.5],
        labels: ["dry", "neutral", "wet"],
      },
      ENSO: {
        file: "climate-monthly.csv",
        column: "ENSO",
        months: "Dec-Feb",
        units: "°C anomaly (generated values)",
        phases: "terciles",
        labels: ["cool", "neutral", "warm"],
      },
      WSI: {
        file: "climate-monthly.csv",
        column: "WSI",
        months: "Dec-Feb",
        units: "hPa anomaly (invented index)",
        phases: "terciles",
        labels: ["weak", "moderate", "strong"],
      },
    },
    outlook: { season: OUTLOOK_SEASON, issued: ISSUED },
    seed: 2027,
    methods: { interval: "wilson", analogs: 10, independenceKm: 40 },
  };

  const files = {
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
    "pmi-monthly.csv": csv(["year", ...MONTHS], wideRows),
    "climate-monthly.csv": csv(["year", "month", "ENSO", "WSI"], longRows),
  };
  for (const outlook of kept) {
    files[`issued/${outlook.season}-${outlook.issued}.json`] = JSON.stringify(outlook, null, 2) + "\n";
  }
  return files;
}

/**
 * Invented kept outlooks for the seasons in KEPT_SEASONS, issued in March of each season, as the
 * tool would keep them (schema firephase.outlook/1), but computed here from the generated data by
 * the simplest form of the method: fire years are the top 10 % of calibration years by share of
 * recording sites burned (ties in); the odds are the share of fire years among the calibration
 * years in this season's PMI phase (Dec–Feb so far, as known in March), with a Wilson interval;
 * the categories are activity terciles among the same years.
 */
function keptOutlooks({ sites, events, pmi, enso, wsi, pmiSeason, ensoSeason, wsiSeason, at }) {
  const burned = new Set(events.map((e) => `${e.site}:${e.year}`));
  const years = [];
  for (let year = CALIBRATION.first; year <= CALIBRATION.last; year += 1) {
    const recording = sites.filter((s) => s.firstYear <= year && year <= s.lastYear);
    if (recording.length < 3) continue;
    const fraction = recording.filter((s) => burned.has(`${s.id}:${year}`)).length / recording.length;
    years.push({ year, fraction, pmi: pmiSeason[at(year)], enso: ensoSeason[at(year)], wsi: wsiSeason[at(year)] });
  }
  const ranked = years.map((y) => y.fraction).sort((a, b) => b - a);
  const threshold = ranked[Math.max(1, Math.ceil(0.1 * ranked.length - 1e-9)) - 1];
  const sortedFraction = years.map((y) => y.fraction).sort((a, b) => a - b);
  const lowerCut = quantile7(sortedFraction, 1 / 3);
  const upperCut = quantile7(sortedFraction, 2 / 3);
  const tercileCuts = (values) => {
    const sorted = values.filter((v) => v !== null).sort((a, b) => a - b);
    return [quantile7(sorted, 1 / 3), quantile7(sorted, 2 / 3)];
  };
  const ensoCuts = tercileCuts(years.map((y) => y.enso));
  const wsiCuts = tercileCuts(years.map((y) => y.wsi));
  const label = (value, cuts, labels) => (value <= cuts[0] ? labels[0] : value <= cuts[1] ? labels[1] : labels[2]);
  const pmiLabels = ["dry", "neutral", "wet"];
  const fireCount = years.filter((y) => y.fraction >= threshold && y.fraction > 0).length;

  return KEPT_SEASONS.map((season, n) => {
    const day = [11, 9, 10, 8, 13, 11, 10, 12][n];
    const issued = `${season}-03-${String(day).padStart(2, "0")}`;
    const so = (map, name) => {
      const monthsUsed = [`${season - 1}-12`, `${season}-01`, `${season}-02`];
      const values = [map.get(`${season - 1}-12`), map.get(`${season}-1`), map.get(`${season}-2`)];
      return { value: round2(meanOf(values)), months: monthsUsed, name };
    };
    const pmiNow = so(pmi, "PMI");
    const ensoNow = so(enso, "ENSO");
    const wsiNow = so(wsi, "WSI");
    const pmiLabel = label(pmiNow.value, [-0.5, 0.5], pmiLabels);
    const inPhase = years.filter((y) => y.pmi !== null && label(y.pmi, [-0.5, 0.5], pmiLabels) === pmiLabel);
    const fires = inPhase.filter((y) => y.fraction >= threshold && y.fraction > 0).length;
    const odds = wilson(fires, inPhase.length);
    const share = (test) => wilson(inPhase.filter(test).length, inPhase.length);
    const span = `Dec ${season - 1}–Feb ${season}`;
    const current = [
      { index: "PMI", value: pmiNow.value, label: pmiLabel, window: "Dec-Mar", provisional: true, months: pmiNow.months, source: `pmi-monthly.csv, ${span} (provisional)` },
      { index: "ENSO", value: ensoNow.value, label: label(ensoNow.value, ensoCuts, ["cool", "neutral", "warm"]), window: "Dec-Feb", provisional: false, months: ensoNow.months, source: `climate-monthly.csv, ${span}` },
      { index: "WSI", value: wsiNow.value, label: label(wsiNow.value, wsiCuts, ["weak", "moderate", "strong"]), window: "Dec-Feb", provisional: false, months: wsiNow.months, source: `climate-monthly.csv, ${span}` },
    ];
    const phases = {};
    for (const c of current) phases[c.index] = c.label;
    return {
      schema: "firephase.outlook/1",
      issued,
      season,
      region: { name: REGION_NAME },
      note: "INVENTED example of a kept outlook, written by demo-region/generate.mjs from its own generated data; not issued by firephase",
      baseRate: wilson(fireCount, years.length),
      phases,
      current,
      fireYear: {
        estimate: odds.estimate,
        lower: odds.lower,
        upper: odds.upper,
        basis: `the ${inPhase.length} calibration years when PMI ${pmiLabel} (Dec-Mar so far: Dec-Feb)`,
        basisIndices: ["PMI"],
        years: inPhase.length,
        fireYears: fires,
      },
      categories: {
        below: share((y) => y.fraction <= lowerCut),
        near: share((y) => y.fraction > lowerCut && y.fraction <= upperCut),
        above: share((y) => y.fraction > upperCut),
      },
    };
  });
}

const { seed, out } = parseArgs(process.argv.slice(2));
const files = generate(seed);
for (const [name, text] of Object.entries(files)) {
  const path = join(out, name);
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, text, "utf8");
}
process.stdout.write(`demo region written to ${out} (seed ${seed}): ${Object.keys(files).length} files\n`);
