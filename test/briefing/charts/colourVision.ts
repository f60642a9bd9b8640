/**
 * Colour-vision checks for the palette test: sRGB → CIELAB (D65) and simulated dichromacy.
 *
 * - sRGB transfer function and sRGB→XYZ matrix: IEC 61966-2-1:1999 "Multimedia systems and
 *   equipment — Colour measurement and management — Part 2-1: Default RGB colour space — sRGB".
 * - CIELAB and ΔE*ab (1976): CIE 15:2004 "Colorimetry", 3rd edition, with the D65 white
 *   (Xn, Yn, Zn) = (0.95047, 1, 1.08883) and the exact constants ε = 216/24389, κ = 24389/27.
 * - Dichromacy: Machado G.M., Oliveira M.M., Fernandes L.A.F. (2009) "A physiologically-based
 *   model for simulation of color vision deficiency", IEEE TVCG 15(6):1291–1298,
 *   doi:10.1109/TVCG.2009.113 — the published severity-1.0 matrices for protanopia,
 *   deuteranopia and tritanopia, applied to linear sRGB and clamped to [0, 1]. The numbers were
 *   compared with three independent public copies of the authors' table (V-secondary).
 */

export type Matrix3 = readonly [readonly [number, number, number], readonly [number, number, number], readonly [number, number, number]];
export type Lab = readonly [number, number, number];

export const MACHADO_2009: Readonly<Record<"protanopia" | "deuteranopia" | "tritanopia", Matrix3>> = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

export type Vision = "normal" | keyof typeof MACHADO_2009;
export const VISIONS: readonly Vision[] = ["normal", "protanopia", "deuteranopia", "tritanopia"];

export function hexToLinearRgb(hex: string): [number, number, number] {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!match) throw new Error(`not a #rrggbb colour: ${hex}`);
  return [match[1], match[2], match[3]].map((part) => {
    const channel = parseInt(part as string, 16) / 255;
    return channel <= 0.04045 ? channel / 12.92 : ((channel + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
}

export function simulate(linear: readonly [number, number, number], vision: Vision): [number, number, number] {
  if (vision === "normal") return [...linear];
  const matrix = MACHADO_2009[vision];
  return matrix.map((row) =>
    Math.min(1, Math.max(0, row[0] * linear[0] + row[1] * linear[1] + row[2] * linear[2])),
  ) as [number, number, number];
}

export function linearRgbToLab(linear: readonly [number, number, number]): Lab {
  const [r, g, b] = linear;
  const x = 0.4124564 * r + 0.3575761 * g + 0.1804375 * b;
  const y = 0.2126729 * r + 0.7151522 * g + 0.072175 * b;
  const z = 0.0193339 * r + 0.119192 * g + 0.9503041 * b;
  const epsilon = 216 / 24389;
  const kappa = 24389 / 27;
  const f = (t: number): number => (t > epsilon ? Math.cbrt(t) : (kappa * t + 16) / 116);
  const fx = f(x / 0.95047);
  const fy = f(y / 1);
  const fz = f(z / 1.08883);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

export function deltaE76(first: Lab, second: Lab): number {
  return Math.hypot(first[0] - second[0], first[1] - second[1], first[2] - second[2]);
}

/** ΔE*ab between two hex colours as seen with the given vision. */
export function seenDeltaE(first: string, second: string, vision: Vision): number {
  return deltaE76(
    linearRgbToLab(simulate(hexToLinearRgb(first), vision)),
    linearRgbToLab(simulate(hexToLinearRgb(second), vision)),
  );
}
