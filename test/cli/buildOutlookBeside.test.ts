import { describe, expect, it } from "vitest";
import { runCalibration } from "../../src/calibrate/runCalibration.js";
import { buildOutlookBeside, startHindcastBeside } from "../../src/cli/buildOutlookBeside.js";
import { buildOutlook } from "../../src/outlook/buildOutlook.js";
import { toOutlookJson } from "../../src/outlook/toOutlookJson.js";
import { syntheticWorkspace } from "../helpers/syntheticWorkspace.js";

// Few shuffles and resamples: these tests check which hindcast is joined, not the skill verdict.
const workspace = syntheticWorkspace({ effect: 1.4, seed: 3, methods: { permutations: 19, bootstrapResamples: 49 } });
const calibration = runCalibration(workspace);
const request = { values: { A: 1.2, B: -0.3 }, issued: "2027-03-10", season: 2027 };
const oneThread = JSON.stringify(toOutlookJson(buildOutlook(workspace, calibration, request)));

describe("buildOutlookBeside with a hindcast started before the calibration was done", () => {
  it("started from the calibration's own years and activity: the one-thread outlook, and the started parts are kept", async () => {
    let stopped = false;
    const started = { ...startHindcastBeside(workspace, calibration, request), stop: () => (stopped = true) };
    const outlook = await buildOutlookBeside(workspace, calibration, request, undefined, started);
    expect(JSON.stringify(toOutlookJson(outlook))).toBe(oneThread);
    expect(stopped).toBe(false);
  });

  it("started from other years: it is stopped and the hindcast computed anew, so the outlook is still the one-thread one", async () => {
    let stopped = false;
    const other = { years: calibration.years.slice(5), activity: calibration.activity };
    const started = { ...startHindcastBeside(workspace, other, request), stop: () => (stopped = true) };
    const outlook = await buildOutlookBeside(workspace, calibration, request, undefined, started);
    expect(stopped).toBe(true);
    expect(JSON.stringify(toOutlookJson(outlook))).toBe(oneThread);
  });
});
