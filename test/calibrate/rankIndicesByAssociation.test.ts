import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { phaseTableChiSquare } from "../../src/calibrate/rankIndicesByAssociation.js";
import { chiSquareIndependence } from "../../src/stats/chiSquareIndependence.js";
import { createRandom } from "../../src/stats/createRandom.js";

describe("phaseTableChiSquare(years, fireYears, offset, phases)", () => {
  it("Agresti (2007) p. 39, party identification by gender as three rows × two columns → X² = 30.07, df 2, p = 2.95e-7", () => {
    // Rows (Democrat, Independent, Republican) × (female, male): [[762, 484], [327, 239], [468, 477]].
    const test = phaseTableChiSquare([1246, 566, 945], [762, 327, 468], 0, 3);
    expect(test.chiSquare).toBeCloseTo(30.0701, 3);
    expect(test.df).toBe(2);
    expect(test.pValue).toBeCloseTo(2.9536e-7, 10);
  });

  it("gives bit for bit chiSquareIndependence's statistic and p on [fire, other] rows, and jStat's chi-square tail, on 500 random tables", () => {
    const random = createRandom(8);
    for (let trial = 0; trial < 500; trial += 1) {
      const phases = 2 + random.nextInt(3);
      const years = Array.from({ length: phases }, () => random.nextInt(40));
      const fire = years.map((total) => random.nextInt(total + 1));
      const mine = phaseTableChiSquare([99, ...years], [99, ...fire], 1, phases);
      const reference = chiSquareIndependence(years.map((total, i) => [fire[i] as number, total - (fire[i] as number)]));
      if (Number.isNaN(reference.pValue)) {
        expect(mine.pValue).toBeNaN();
        expect(mine.df).toBe(0);
        continue;
      }
      expect(mine.chiSquare).toBe(reference.chiSquare);
      expect(mine.df).toBe(reference.df);
      expect(mine.pValue).toBe(reference.pValue);
      expect(mine.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(mine.chiSquare, mine.df), 9);
    }
  });
});
