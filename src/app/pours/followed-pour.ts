// The device store follows pours too (it redraws a pour's stock as its layers go on), so the piece lives in sync/.
export { followLocalPour, layersOfPours } from '../sync/followed-pour';
