import { displayUnitsFor, type DisplayUnits } from '@benchtide/shared';
import {
  convertFields,
  createPourForm,
  parseOutline,
  presetFields,
  toPlanRequest,
  type PourFormValue,
} from './pour-form';

// Conversions checked here: 1 in = 25.4 mm and °F = 1.8 × °C + 32 (NIST SP 811); 1 US fl oz = 29.5735295625 mL
// (NIST Handbook 44, Appendix C); 1 in² = 645.16 mm² and 1 cm² = 100 mm² follow from them.
// Preset numbers are the typical values from memory in shared/material-presets.ts.

const METRIC = displayUnitsFor('metric');
const IMPERIAL = displayUnitsFor('imperial');

function formValue(change: Partial<PourFormValue> = {}, units: DisplayUnits = METRIC): PourFormValue {
  const form = createPourForm();
  form.patchValue({ length: '120', width: '45', depth: '6', roomTemp: '20', startAt: '2026-03-14T09:30' });
  form.patchValue(presetFields('deep-pour-epoxy', units));
  form.patchValue(change);
  return form.getRawValue();
}

describe('pour form', () => {
  describe('toPlanRequest', () => {
    it('should send metric fields as they are, times in minutes', () => {
      const request = toPlanRequest(formValue(), METRIC, 0.1);

      expect(request.shape).toEqual({ kind: 'rectangle', lengthMm: 120, widthMm: 45 });
      expect(request.depthMm).toBe(6);
      expect(request.displacedMl).toBe(0);
      expect(request.wastePercent).toBe(10);
      expect(request.roomTempC).toBe(20);
      expect(request.scaleResolutionG).toBe(0.1);
      expect(request.startAtMs).toBe(new Date(2026, 2, 14, 9, 30).getTime());
      // 24 h, 72 h, 72 h and 7 d of the deep-pour preset, × 60 min/h.
      expect(request.material).toEqual({
        mixRatio: { basis: 'volume', partA: 2, partB: 1 },
        densityAGPerMl: 1.12,
        densityBGPerMl: 0.98,
        potLifeMin: 180,
        recoatMin: 1440,
        recoatMaxMin: 4320,
        demouldMin: 4320,
        fullCureMin: 10080,
        referenceTempC: 25,
        minCureTempC: 18,
        maxLayerMm: 50,
      });
    });

    it('should read imperial fields into millimetres, millilitres and degrees Celsius', () => {
      const request = toPlanRequest(
        formValue(
          { length: '2', width: '1.5', depth: '0.25', displaced: '1', roomTemp: '68', maxLayer: '2' },
          IMPERIAL,
        ),
        IMPERIAL,
        0.1,
      );

      // 2 in = 50.8 mm, 1.5 in = 38.1 mm, 0.25 in = 6.35 mm, 2 in = 50.8 mm; 68 °F = 20 °C; 1 fl oz = 29.5735 mL.
      const shape = request.shape as { kind: string; lengthMm: number; widthMm: number };
      expect(shape.kind).toBe('rectangle');
      expect(shape.lengthMm).toBeCloseTo(50.8, 10);
      expect(shape.widthMm).toBeCloseTo(38.1, 10);
      expect(request.depthMm).toBeCloseTo(6.35, 10);
      expect(request.displacedMl).toBeCloseTo(29.5735295625, 10);
      expect(request.roomTempC).toBeCloseTo(20, 10);
      // The preset's 25 °C shown as 77 °F comes back as 25 °C.
      expect(request.material.referenceTempC).toBeCloseTo(25, 10);
      expect(request.material.maxLayerMm).toBeCloseTo(50.8, 10);
    });

    it('should take a comma as the decimal point', () => {
      expect(toPlanRequest(formValue({ depth: '6,5' }), METRIC, 0.1).depthMm).toBe(6.5);
    });

    it('should send what cannot be read as NaN, for the schema to explain', () => {
      const request = toPlanRequest(formValue({ depth: 'abc', densityA: '' }), METRIC, 0.1);

      expect(request.depthMm).toBeNaN();
      expect(request.material.densityAGPerMl).toBeNaN();
    });

    it('should leave out part B, its density and the recoat window when they are empty', () => {
      const request = toPlanRequest(formValue({ partB: '', densityB: '', recoatMaxH: '' }), METRIC, 0.1);

      expect(request.material.mixRatio).toEqual({ basis: 'volume', partA: 2 });
      expect('densityBGPerMl' in request.material).toBeFalse();
      expect('recoatMaxMin' in request.material).toBeFalse();
    });

    it('should count empty displaced and extra fields as 0', () => {
      const request = toPlanRequest(formValue({ displaced: '', wastePercent: '' }), METRIC, 0.1);

      expect(request.displacedMl).toBe(0);
      expect(request.wastePercent).toBe(0);
    });

    it('should send a start time that cannot be read as NaN', () => {
      expect(toPlanRequest(formValue({ startAt: '' }), METRIC, 0.1).startAtMs).toBeNaN();
    });

    it('should send each shape in millimetres', () => {
      expect(toPlanRequest(formValue({ shapeKind: 'circle', diameter: '100' }), METRIC, 0.1).shape).toEqual({
        kind: 'circle',
        diameterMm: 100,
      });
      expect(
        toPlanRequest(formValue({ shapeKind: 'ellipse', length: '4', width: '2' }, IMPERIAL), IMPERIAL, 0.1).shape,
      ).toEqual({ kind: 'ellipse', lengthMm: 101.6, widthMm: 50.8 });
    });

    it('should read an area in cm² for metric and in² for imperial', () => {
      // 54 cm² = 5400 mm²; 2 in² = 2 × 645.16 = 1290.32 mm².
      expect(toPlanRequest(formValue({ shapeKind: 'area', area: '54' }), METRIC, 0.1).shape).toEqual({
        kind: 'area',
        areaMm2: 5400,
      });
      expect(toPlanRequest(formValue({ shapeKind: 'area', area: '2' }), IMPERIAL, 0.1).shape).toEqual({
        kind: 'area',
        areaMm2: 1290.32,
      });
    });
  });

  describe('parseOutline', () => {
    it('should read one "x, y" per line, skipping blank lines', () => {
      expect(parseOutline('3, 4\n\n 5, 11 \n12 8\n9;5', METRIC)).toEqual([
        { xMm: 3, yMm: 4 },
        { xMm: 5, yMm: 11 },
        { xMm: 12, yMm: 8 },
        { xMm: 9, yMm: 5 },
      ]);
    });

    it('should take a comma with no space after it as a decimal point', () => {
      expect(parseOutline('3,5 4,25', METRIC)).toEqual([{ xMm: 3.5, yMm: 4.25 }]);
    });

    it('should read inches into millimetres', () => {
      // 1 in = 25.4 mm, 0.5 in = 12.7 mm.
      expect(parseOutline('1, 0.5', IMPERIAL)).toEqual([{ xMm: 25.4, yMm: 12.7 }]);
    });

    it('should give NaN for a point that cannot be read', () => {
      const [point] = parseOutline('3', METRIC);

      expect(point?.xMm).toBe(3);
      expect(point?.yMm).toBeNaN();
    });
  });

  describe('convertFields', () => {
    it('should re-express lengths, temperatures, volumes and areas in imperial', () => {
      const change = convertFields(
        formValue({ displaced: '29.5735295625', area: '6.4516', diameter: '25.4' }),
        METRIC,
        IMPERIAL,
      );

      // 120 / 25.4 = 4.724; 45 / 25.4 = 1.772; 6 / 25.4 = 0.236; 50 / 25.4 = 1.969; 25.4 mm = 1 in;
      // 20 °C = 68 °F, 25 °C = 77 °F, 18 °C = 64.4 °F; 29.5735 mL = 1 fl oz; 6.4516 cm² = 645.16 mm² = 1 in².
      expect(change).toEqual(
        jasmine.objectContaining({
          length: '4.724',
          width: '1.772',
          depth: '0.236',
          maxLayer: '1.969',
          diameter: '1',
          roomTemp: '68',
          referenceTemp: '77',
          minCureTemp: '64.4',
          displaced: '1',
          area: '1',
        }),
      );
    });

    it('should leave what cannot be read as it was typed', () => {
      const change = convertFields(formValue({ depth: 'abc', diameter: '' }), METRIC, IMPERIAL);

      expect(change.depth).toBe('abc');
      expect(change.diameter).toBe('');
    });

    it('should convert each point of an outline and keep its layout', () => {
      const change = convertFields(formValue({ outline: '25.4, 50.8\n12.7 0' }), METRIC, IMPERIAL);

      // 25.4 mm = 1 in, 50.8 mm = 2 in, 12.7 mm = 0.5 in.
      expect(change.outline).toBe('1, 2\n0.5 0');
    });

    it('should not touch times, ratios or densities', () => {
      const change = convertFields(formValue(), METRIC, IMPERIAL);

      expect(Object.keys(change)).not.toContain('potLifeMin');
      expect(Object.keys(change)).not.toContain('partA');
      expect(Object.keys(change)).not.toContain('densityA');
    });
  });

  describe('presetFields', () => {
    it('should give the deep-pour preset in hours and millimetres', () => {
      // 1440, 4320, 4320 and 10 080 min / 60 = 24, 72, 72 and 168 h.
      expect(presetFields('deep-pour-epoxy', METRIC)).toEqual({
        basis: 'volume',
        partA: '2',
        partB: '1',
        densityA: '1.12',
        densityB: '0.98',
        potLifeMin: '180',
        recoatH: '24',
        recoatMaxH: '72',
        demouldH: '72',
        fullCureH: '168',
        referenceTemp: '25',
        minCureTemp: '18',
        maxLayer: '50',
      });
    });

    it('should give a single-part medium no part B and no recoat window', () => {
      const fields = presetFields('acrylic-gloss-medium', METRIC);

      expect(fields.partB).toBe('');
      expect(fields.densityB).toBe('');
      expect(fields.recoatMaxH).toBe('');
      expect(fields.maxLayer).toBe('3');
    });

    it('should give lengths and temperatures in the display units', () => {
      const fields = presetFields('coating-epoxy', IMPERIAL);

      // 6 mm / 25.4 = 0.236 in; 25 °C = 77 °F; 18 °C = 64.4 °F.
      expect(fields.maxLayer).toBe('0.236');
      expect(fields.referenceTemp).toBe('77');
      expect(fields.minCureTemp).toBe('64.4');
    });

    it('should give nothing for an unknown preset', () => {
      expect(presetFields('no-such-preset', METRIC)).toEqual({});
    });
  });
});
