import {
  DEFERENCE_NOTE,
  MATERIAL_PRESETS,
  materialDataSheetSchema,
  planPour,
  safetyCautions,
} from '../../shared/index.js';

describe('material presets', () => {
  it('should each pass the same data-sheet validation a typed-in material gets', () => {
    for (const preset of MATERIAL_PRESETS) {
      const parsed = materialDataSheetSchema.safeParse(preset.dataSheet);
      expect(parsed.success).withContext(preset.id).toBeTrue();
    }
  });

  it('should each plan a pour of a 100 x 50 mm pond, 6 mm deep', () => {
    for (const preset of MATERIAL_PRESETS) {
      const result = planPour({
        shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
        depthMm: 6,
        material: preset.dataSheet,
        roomTempC: 21,
        startAtMs: 0,
        scaleResolutionG: 0.1,
      });
      expect(result.ok).withContext(preset.id).toBeTrue();
    }
  });

  it('should give single-part media no part B and two-part epoxies both densities', () => {
    for (const preset of MATERIAL_PRESETS) {
      const twoPart = (preset.dataSheet.mixRatio.partB ?? 0) > 0;
      expect(twoPart)
        .withContext(preset.id)
        .toBe(preset.kind === 'two-part-epoxy');
      expect(preset.dataSheet.densityBGPerMl !== undefined)
        .withContext(preset.id)
        .toBe(twoPart);
    }
  });
});

describe('safetyCautions', () => {
  // Common practice for epoxy: skin protection, ventilation, exotherm of thick pours, foam melting.
  it('should warn about skin, air, layer thickness and foam for two-part epoxy', () => {
    const ids = safetyCautions('two-part-epoxy').map((caution) => caution.id);

    expect(ids).toEqual(jasmine.arrayContaining(['gloves', 'air', 'layer', 'foam']));
  });

  it('should give water-based media their own cautions, and always defer to the data sheet', () => {
    expect(safetyCautions('water-gel').map((caution) => caution.id)).toContain('layer');
    expect(DEFERENCE_NOTE).toContain('safety data sheet');
  });
});
