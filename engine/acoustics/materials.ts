/**
 * A small library of lining materials, of our own invention: each entry is a typical round figure of
 * static airflow resistivity for a kind of material, not the datasheet value of any product. Real
 * linings vary by a factor of two or more within a kind; measure σ (ISO 9053) for a design figure.
 * The one-parameter models in porous.ts were fitted to fibrous materials, so the foam entry is rough.
 */
export interface LiningMaterial {
  /** What a scenario writes as "library". */
  id: string;
  label: string;
  /** Static airflow resistivity σ, Pa·s/m². */
  flowResistivity: number;
  /** Always true: a typical round figure, not a product's value. */
  typical: true;
  note: string;
}

const entry = (id: string, label: string, flowResistivity: number, note: string): LiningMaterial =>
  ({ id, label, flowResistivity, typical: true, note });

export const LINING_MATERIALS: readonly LiningMaterial[] = [
  entry('glass-wool-light', 'Glass wool, light (typical σ ≈ 5 kPa·s/m²)', 5_000, 'low-density fibrous batt; nearly transparent at high frequencies'),
  entry('mineral-wool-light', 'Mineral wool, light (typical σ ≈ 10 kPa·s/m²)', 10_000, 'low-density slab or batt'),
  entry('mineral-wool-medium', 'Mineral wool, medium (typical σ ≈ 20 kPa·s/m²)', 20_000, 'medium-density slab, a common duct lining'),
  entry('mineral-wool-dense', 'Mineral wool, dense (typical σ ≈ 50 kPa·s/m²)', 50_000, 'high-density board; absorbs best in thick layers'),
  entry('polyester-fibre', 'Polyester fibre batt (typical σ ≈ 8 kPa·s/m²)', 8_000, 'fibrous, so within what the models were fitted to'),
  entry('open-cell-foam', 'Open-cell foam (typical σ ≈ 15 kPa·s/m²)', 15_000, 'the fibrous-material fits describe foams only roughly'),
];

export const LINING_MATERIAL_IDS: readonly string[] = LINING_MATERIALS.map((m) => m.id);

export function liningMaterial(id: string): LiningMaterial | undefined {
  return LINING_MATERIALS.find((m) => m.id === id);
}
