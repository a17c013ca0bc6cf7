import { DataFieldsHarness } from '../core/data-fields-testing';

/** The typed fields of `DataSheetFields` by their `data-field` names. */
export type DataSheetField =
  | 'partA'
  | 'partB'
  | 'densityA'
  | 'densityB'
  | 'maxLayer'
  | 'potLife'
  | 'recoat'
  | 'recoatMax'
  | 'demould'
  | 'fullCure'
  | 'referenceTemp'
  | 'minCureTemp';

/** Harness for `bt-data-sheet-fields`: a material's data sheet as typed in display units. */
export class DataSheetFieldsHarness extends DataFieldsHarness<DataSheetField> {
  static hostSelector = 'bt-data-sheet-fields';
}
