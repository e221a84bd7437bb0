import { describe, expect, it } from 'vitest';
import { EU_2003_10_EC, exposureCautions, modelAssumptions, NIOSH_1998, OSHA_1910_95 } from '../../engine/report/index.ts';

const lineWith = (lines: string[], ...words: string[]) => lines.find((l) => words.every((w) => l.includes(w)));

describe('exposureCautions', () => {
  const { title, lines, sources } = exposureCautions();

  it('has a title and names its sources', () => {
    expect(title.length).toBeGreaterThan(0);
    expect(sources).toEqual([NIOSH_1998, OSHA_1910_95, EU_2003_10_EC]);
    expect(NIOSH_1998).toContain('98-126');
  });

  it('states the NIOSH recommended exposure limit', () => {
    // Source: NIOSH, Criteria for a Recommended Standard: Occupational Noise Exposure, DHHS (NIOSH) Publication No. 98-126 (1998): REL 85 dBA 8-h TWA, 3-dB exchange rate
    expect(lineWith(lines, 'NIOSH', '85 dBA', '8-hour', '3 dB exchange')).toBeDefined();
  });

  it('states the OSHA permissible exposure limit and action level', () => {
    // Source: 29 CFR 1910.95(b) and (c): PEL 90 dBA 8-h TWA with 5-dB exchange rate; action level 85 dBA
    expect(lineWith(lines, '1910.95', '90 dBA', '5 dB exchange', 'action level 85 dBA')).toBeDefined();
  });

  it('states the EU exposure action and limit values', () => {
    // Source: Directive 2003/10/EC, Article 3(1): lower action values 80 dB(A) / 135 dB(C), upper 85 dB(A) / 137 dB(C), limit values 87 dB(A) / 140 dB(C)
    expect(lineWith(lines, '2003/10/EC', 'L_EX,8h', '80 dB(A) and 135 dB(C)', '85 dB(A) and 137 dB(C)', '87 dB(A) and 140 dB(C)')).toBeDefined();
  });

  it('carries the model assumptions and the limits of a prediction', () => {
    for (const line of modelAssumptions().lines) expect(lines).toContain(line);
    expect(lineWith(lines, 'do not replace measurement')).toBeDefined();
  });
});

describe('modelAssumptions', () => {
  it('lists linear acoustics, no mean flow, rigid walls and the dependence of 3D results on mesh and absorbing layers', () => {
    const { lines } = modelAssumptions();
    expect(lineWith(lines, 'Linear acoustics')).toBeDefined();
    expect(lineWith(lines, 'No mean flow')).toBeDefined();
    expect(lineWith(lines, 'rigid unless a lining')).toBeDefined();
    expect(lineWith(lines, '3D results', 'mesh', 'absorbing layers')).toBeDefined();
  });
});
