/** The routes that follow a pour through its layers, as the API description lists them; see openapi-document.ts for the rest. */
import * as z from 'zod';
import { newPourLayerSchema, pourLayerPatchSchema, pourPatchSchema } from '../../shared/domain-schemas.js';
import type { ApiRoute } from './openapi-document.js';

const w = '/api/workshops/{workshopId}';
const STOCK_SHORT =
  'What the layers now take is more than the shelf holds of a part the pour was not short of (code stock_short).';
const NO_SUCH_LAYER = 'There is no such layer in this workshop, or its pour was deleted (code not_found).';

export const POUR_PATH_PARAMETERS: Readonly<Record<string, z.ZodType>> = {
  layerId: z.uuid().meta({ description: 'The layer (layer 1 shares its pour’s id).' }),
};

export const POUR_ROUTES: readonly ApiRoute[] = [
  {
    method: 'patch',
    path: `${w}/pours/{pourId}`,
    tag: 'Pours',
    summary: 'Correct a pour’s note or re-plan the number of layers',
    access: 'write-builds',
    body: pourPatchSchema,
    success: { status: 200, description: 'The pour, drawn again from the shelf for the layers now planned.' },
    refusals: {
      400: 'The layers already poured or the maximum layer thickness do not allow that many layers; `fields.layerCount` says why.',
      404: 'There is no such pour in this workshop (code not_found).',
      409: STOCK_SHORT,
    },
  },
  {
    method: 'get',
    path: `${w}/pours/{pourId}/layers`,
    tag: 'Pours',
    summary: 'List the layers of a pour recorded as poured',
    access: 'view',
    success: { status: 200, description: 'Each poured layer: when, in what room, its plan and what was weighed.' },
    refusals: { 404: 'There is no such pour in this workshop (code not_found).' },
  },
  {
    method: 'post',
    path: `${w}/layers`,
    tag: 'Pours',
    summary: 'Record the next layer of a pour as poured',
    access: 'write-builds',
    body: newPourLayerSchema,
    success: { status: 201, description: 'The layer; the pour’s stock and reminders now follow it.' },
    refusals: {
      400: 'Not the next layer, beyond the plan, before the layer below or more than an hour ahead; `fields` says why.',
      404: 'There is no such pour in this workshop, or it was deleted (code not_found).',
      409: `That layer was already recorded (code layer_already_poured; the message names the time kept). ${STOCK_SHORT} A record with this id exists already (code id_taken).`,
    },
  },
  {
    method: 'patch',
    path: `${w}/layers/{layerId}`,
    tag: 'Pours',
    summary: 'Correct a poured layer: its time, room, what was weighed or its note',
    access: 'write-builds',
    body: pourLayerPatchSchema,
    success: { status: 200, description: 'The layer; the pour’s stock and reminders follow the correction.' },
    refusals: {
      400: 'The time would put the layer before the one below, after the one above, or more than an hour ahead.',
      404: NO_SUCH_LAYER,
      409: STOCK_SHORT,
    },
  },
  {
    method: 'delete',
    path: `${w}/layers/{layerId}`,
    tag: 'Pours',
    summary: 'Take back the topmost poured layer',
    access: 'write-builds',
    success: { status: 204, description: 'Taken back; the layer is to pour again and its stock is back on the shelf.' },
    refusals: {
      404: NO_SUCH_LAYER,
      409: 'Only the topmost layer can be taken back (code not_top_layer), and layer 1 only with its pour (code first_layer).',
    },
  },
];
