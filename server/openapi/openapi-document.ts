/**
 * The API described as an OpenAPI 3 document, built from the very zod schemas the routes validate
 * request bodies with, so the description cannot drift from the checks. Who may call a route comes
 * from the shared workshop policy, the same one the server enforces.
 */
import { OpenAPIRegistry, OpenApiGeneratorV3, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import * as z from 'zod';
import {
  changePasswordRequestSchema,
  deleteAccountRequestSchema,
  emailOnlyRequestSchema,
  invitationRequestSchema,
  memberRoleRequestSchema,
  resetPasswordRequestSchema,
  ROLES,
  signInRequestSchema,
  signUpRequestSchema,
  updateAccountRequestSchema,
  verifyEmailRequestSchema,
  workshopRequestSchema,
  type ApiErrorBody,
  type Role,
} from '../../shared/account-schemas.js';
import {
  buildPatchSchema,
  containerPatchSchema,
  materialPatchSchema,
  newBuildSchema,
  newContainerSchema,
  newMaterialSchema,
  newPourSchema,
  newStepSchema,
  stepPatchSchema,
  stocktakeSchema,
  wasteSchema,
} from '../../shared/domain-schemas.js';
import { CHANGE_TYPES } from '../../shared/record-kinds.js';
import { pullQuerySchema, pushRequestSchema, recordSchema } from '../../shared/sync-schemas.js';
import { may, type WorkshopAction } from '../../shared/workshop-policy.js';
import { SESSION_COOKIE } from '../auth/lucia-session-store.js';
import { EXPORT_TABLES } from '../export/export-service.js';
import { PHOTO_BODY_NAMES, PHOTO_PATH_PARAMETERS, PHOTO_ROUTES } from './photo-operations.js';
import { POUR_PATH_PARAMETERS, POUR_ROUTES } from './pour-operations.js';
import { REMINDER_BODY_NAMES, REMINDER_ROUTES } from './reminder-operations.js';

export type OpenApiDocument = ReturnType<OpenApiGeneratorV3['generateDocument']>;

/** Read by the reference page as well as by programs: who may call an operation. */
export const ACCESS_EXTENSION = 'x-benchtide-access';
export interface OperationAccess {
  readonly signInNeeded: boolean;
  /** For routes inside a workshop: the member roles the policy lets through. */
  readonly roles?: readonly Role[];
  readonly who: string;
}

const TAGS = [
  { name: 'Health', description: 'Whether the server is up and reaches its database.' },
  { name: 'Reference', description: 'This description of the API, for programs and for people.' },
  {
    name: 'Sign-in',
    description: 'Signing up, confirming an e-mail address, signing in and out, and choosing a new password.',
  },
  { name: 'Account', description: 'Your own account: its name, its password, and deleting it.' },
  { name: 'Workshops', description: 'Workshops and who is in them. Everything recorded belongs to a workshop.' },
  { name: 'Invitations', description: 'Asking someone to join a workshop, and answering an invitation.' },
  { name: 'Builds', description: 'Builds and the log of steps taken on each.' },
  {
    name: 'Shelf',
    description: 'Materials with their data sheets, the containers (lots) of them on the shelf, waste and stocktakes.',
  },
  { name: 'Pours', description: 'What was mixed and poured for a build, drawn from the containers on the shelf.' },
  {
    name: 'Photos',
    description: 'Bench photos of a build, a step or a pour: kept without location or other metadata.',
  },
  {
    name: 'Reminders',
    description: 'When a pour needs you back at the bench, and the weekly word on the shelf: by push or e-mail.',
  },
  { name: 'Costs and export', description: "What builds cost, and a workshop's records to keep or take elsewhere." },
  {
    name: 'Sync',
    description:
      'How a device sends the changes it made offline, and fetches what changed elsewhere since it last looked.',
  },
] as const;
type Tag = (typeof TAGS)[number]['name'];

/** Anyone at all, anyone signed in, or workshop members whose role the policy allows this action. */
type Access = 'anyone' | 'signed-in' | WorkshopAction;

export interface ApiRoute {
  readonly method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** OpenAPI form: /api/workshops/{workshopId}/builds. */
  readonly path: string;
  readonly tag: Tag;
  readonly summary: string;
  readonly access: Access;
  /** Where the policy has an exception for this route. */
  readonly accessNote?: string;
  /** The shared schema the route validates its body with. */
  readonly body?: z.ZodType;
  /** How the body is sent, when it is not JSON. */
  readonly bodyMedia?: 'multipart/form-data';
  /** The shared schema the route validates its query string with. */
  readonly query?: z.ZodObject;
  readonly success: { readonly status: number; readonly description: string; readonly media?: MediaType };
  /** Refusals particular to this route, on top of those every route of its kind can give. */
  readonly refusals?: Readonly<Record<number, string>>;
  /** Answers that are neither a success nor an error body. */
  readonly otherAnswers?: Readonly<Record<number, string>>;
}
type MediaType = 'application/json' | 'text/csv' | 'text/html' | 'image/jpeg';

/** The names request bodies go by in the document. */
const BODY_NAMES = new Map<z.ZodType, string>([
  [signUpRequestSchema, 'SignUpRequest'],
  [verifyEmailRequestSchema, 'VerifyEmailRequest'],
  [emailOnlyRequestSchema, 'EmailOnlyRequest'],
  [signInRequestSchema, 'SignInRequest'],
  [resetPasswordRequestSchema, 'ResetPasswordRequest'],
  [updateAccountRequestSchema, 'UpdateAccountRequest'],
  [changePasswordRequestSchema, 'ChangePasswordRequest'],
  [deleteAccountRequestSchema, 'DeleteAccountRequest'],
  [workshopRequestSchema, 'WorkshopRequest'],
  [memberRoleRequestSchema, 'MemberRoleRequest'],
  [invitationRequestSchema, 'InvitationRequest'],
  // A change's data goes by its schema's name: newBuildSchema is NewBuild.
  ...CHANGE_TYPES.flatMap(({ spec }): [z.ZodType, string][] =>
    'data' in spec && spec.data
      ? [[recordSchema(spec.data), spec.data.replace(/Schema$/, '').replace(/^./, (first) => first.toUpperCase())]]
      : [],
  ),
  [pushRequestSchema, 'PushRequest'],
  ...PHOTO_BODY_NAMES,
  ...REMINDER_BODY_NAMES,
]);

const recordId = (what: string) => z.uuid().meta({ description: what });
const PATH_PARAMETERS: Readonly<Record<string, z.ZodType>> = {
  workshopId: recordId('The workshop.'),
  userId: recordId("The member's account."),
  invitationId: recordId('The invitation.'),
  buildId: recordId('The build.'),
  stepId: recordId('The step.'),
  materialId: recordId('The material.'),
  containerId: recordId('The container.'),
  pourId: recordId('The pour.'),
  token: z.string().meta({ description: 'The token from the invitation link.' }),
  table: z.enum(Object.keys(EXPORT_TABLES) as [string, ...string[]]).meta({ description: 'Which table to download.' }),
  ...PHOTO_PATH_PARAMETERS,
  ...POUR_PATH_PARAMETERS,
};

const w = '/api/workshops/{workshopId}';
const ID_TAKEN = 'A record with this id exists already (code id_taken): ids are made on the device, once.';
const RATE_LIMITED =
  'Too many attempts from this address or for this account (code rate_limited); `retryAfterMinutes` and the Retry-After header say when to try again.';
const TOKEN_REFUSED = 'The link has expired or has already been used (code token_invalid).';
const COVER_REFUSED =
  '`coverPhotoId` is not a photo of this build, or that photo has been deleted (code cover_not_in_build). Upload the photo first.';
const noSuch = (what: string) => `There is no such ${what} in this workshop (code not_found).`;

const API_ROUTES: readonly ApiRoute[] = [
  {
    method: 'get',
    path: '/api/health',
    tag: 'Health',
    summary: 'Check the server and its database',
    access: 'anyone',
    success: { status: 200, description: "Up and reaching the database: { status: 'ok', database: 'reachable' }." },
    otherAnswers: {
      503: "Up, but the database does not answer: { status: 'degraded', database: 'unreachable' }.",
    },
  },
  {
    method: 'get',
    path: '/api/openapi.json',
    tag: 'Reference',
    summary: 'Get this API described as an OpenAPI 3 document',
    access: 'anyone',
    success: { status: 200, description: 'This document.' },
  },
  {
    method: 'get',
    path: '/api/reference',
    tag: 'Reference',
    summary: 'Read the API reference as a web page',
    access: 'anyone',
    success: { status: 200, description: 'The reference page.', media: 'text/html' },
  },
  {
    method: 'post',
    path: '/api/auth/sign-up',
    tag: 'Sign-in',
    summary: 'Create an account',
    access: 'anyone',
    body: signUpRequestSchema,
    success: {
      status: 202,
      description:
        '`message` says what happens next; `next` is confirm-email (follow the e-mailed link) or sign-in (an invitation to this address already proved it). An address that has an account already gets an e-mail instead, and the same answer.',
    },
    refusals: {
      400: 'A password from the lists attackers try first is refused on `password`.',
      429: RATE_LIMITED,
    },
  },
  {
    method: 'post',
    path: '/api/auth/verify',
    tag: 'Sign-in',
    summary: 'Confirm an e-mail address with the token from the link',
    access: 'anyone',
    body: verifyEmailRequestSchema,
    success: { status: 200, description: 'Confirmed: { verified: true }.' },
    refusals: { 400: TOKEN_REFUSED },
  },
  {
    method: 'post',
    path: '/api/auth/verify/resend',
    tag: 'Sign-in',
    summary: 'Send the confirmation link again',
    access: 'anyone',
    body: emailOnlyRequestSchema,
    success: {
      status: 202,
      description: 'A new link goes out if the address still needs confirming; the answer is the same either way.',
    },
    refusals: { 429: RATE_LIMITED },
  },
  {
    method: 'post',
    path: '/api/auth/sign-in',
    tag: 'Sign-in',
    summary: 'Sign in with e-mail and password',
    access: 'anyone',
    body: signInRequestSchema,
    success: {
      status: 200,
      description:
        'Signed in: sets the session cookie and answers the account and its workshops. A session this browser had before ends.',
    },
    refusals: {
      401: 'The e-mail and password do not match an account (code invalid_credentials).',
      403: 'The e-mail address is not confirmed yet (code email_not_verified).',
      429: RATE_LIMITED,
    },
  },
  {
    method: 'post',
    path: '/api/auth/sign-out',
    tag: 'Sign-in',
    summary: 'Sign out on this device',
    access: 'anyone',
    success: { status: 204, description: 'Signed out, or was not signed in; the session cookie is cleared.' },
  },
  {
    method: 'post',
    path: '/api/auth/sign-out-others',
    tag: 'Sign-in',
    summary: 'Sign out on every other device',
    access: 'signed-in',
    success: { status: 204, description: 'Every other session of the account has ended; this one stays.' },
  },
  {
    method: 'post',
    path: '/api/auth/forgot',
    tag: 'Sign-in',
    summary: 'Ask for a link to choose a new password',
    access: 'anyone',
    body: emailOnlyRequestSchema,
    success: {
      status: 202,
      description: 'A link goes out if the address has an account; the answer is the same either way.',
    },
    refusals: { 429: RATE_LIMITED },
  },
  {
    method: 'post',
    path: '/api/auth/reset',
    tag: 'Sign-in',
    summary: 'Choose a new password with the token from the link',
    access: 'anyone',
    body: resetPasswordRequestSchema,
    success: {
      status: 204,
      description: 'The password is changed and every session of the account has ended: sign in with the new one.',
    },
    refusals: { 400: `${TOKEN_REFUSED} A common password is refused on \`newPassword\`.` },
  },
  {
    method: 'get',
    path: '/api/account',
    tag: 'Account',
    summary: 'Get your account and your workshops',
    access: 'signed-in',
    success: { status: 200, description: 'The account and every workshop it belongs to, with its role in each.' },
  },
  {
    method: 'patch',
    path: '/api/account',
    tag: 'Account',
    summary: 'Change your name',
    access: 'signed-in',
    body: updateAccountRequestSchema,
    success: { status: 200, description: 'The account, with the new name, and its workshops.' },
  },
  {
    method: 'post',
    path: '/api/account/password',
    tag: 'Account',
    summary: 'Change your password',
    access: 'signed-in',
    body: changePasswordRequestSchema,
    success: { status: 204, description: 'Changed; every other session has ended and this device stays signed in.' },
    refusals: {
      400: '`currentPassword` is not the current password, or `newPassword` is one of the common ones.',
    },
  },
  {
    method: 'delete',
    path: '/api/account',
    tag: 'Account',
    summary: 'Delete your account',
    access: 'signed-in',
    body: deleteAccountRequestSchema,
    success: {
      status: 204,
      description: 'Deleted, with every workshop no one else was in; the session cookie is cleared.',
    },
    refusals: {
      400: '`password` is not the current password.',
      409: 'You are the only owner of a workshop others are in (code sole_owner): make one of them an owner first.',
    },
  },
  {
    method: 'get',
    path: '/api/workshops',
    tag: 'Workshops',
    summary: 'List your workshops',
    access: 'signed-in',
    success: { status: 200, description: 'Each workshop with your role in it and how many members it has.' },
  },
  {
    method: 'post',
    path: '/api/workshops',
    tag: 'Workshops',
    summary: 'Start a workshop',
    access: 'signed-in',
    body: workshopRequestSchema,
    success: { status: 201, description: 'The new workshop; you are its owner.' },
  },
  {
    method: 'patch',
    path: w,
    tag: 'Workshops',
    summary: 'Rename a workshop',
    access: 'rename',
    body: workshopRequestSchema,
    success: { status: 200, description: 'The workshop with its new name.' },
  },
  {
    method: 'get',
    path: `${w}/members`,
    tag: 'Workshops',
    summary: 'List the members of a workshop',
    access: 'view',
    success: { status: 200, description: "The members and their roles; only owners see members' e-mail addresses." },
  },
  {
    method: 'patch',
    path: `${w}/members/{userId}`,
    tag: 'Workshops',
    summary: "Change a member's role",
    access: 'manage-members',
    body: memberRoleRequestSchema,
    success: { status: 200, description: 'The member with the new role.' },
    refusals: {
      404: 'This person is not a member of the workshop (code member_unknown).',
      409: 'The workshop would be left without an owner (code last_owner).',
    },
  },
  {
    method: 'delete',
    path: `${w}/members/{userId}`,
    tag: 'Workshops',
    summary: 'Remove a member, or leave a workshop',
    access: 'manage-members',
    accessNote: 'Any member may remove themself, which is leaving.',
    success: { status: 204, description: 'The member is no longer in the workshop.' },
    refusals: {
      404: 'This person is not a member of the workshop (code member_unknown).',
      409: 'The workshop would be left without an owner (code last_owner).',
    },
  },
  {
    method: 'get',
    path: `${w}/invitations`,
    tag: 'Invitations',
    summary: 'List the open invitations of a workshop',
    access: 'manage-invitations',
    success: { status: 200, description: 'Invitations not yet accepted and not expired.' },
  },
  {
    method: 'post',
    path: `${w}/invitations`,
    tag: 'Invitations',
    summary: 'Invite someone by e-mail',
    access: 'manage-invitations',
    body: invitationRequestSchema,
    success: { status: 201, description: 'The invitation; a link to accept it goes out to the address.' },
  },
  {
    method: 'delete',
    path: `${w}/invitations/{invitationId}`,
    tag: 'Invitations',
    summary: 'Withdraw an invitation',
    access: 'manage-invitations',
    success: { status: 204, description: 'Withdrawn; its link no longer works.' },
    refusals: { 404: 'There is no such invitation (code invitation_unknown).' },
  },
  {
    method: 'get',
    path: '/api/invitations/{token}',
    tag: 'Invitations',
    summary: 'See what an invitation offers',
    access: 'anyone',
    success: {
      status: 200,
      description: 'The workshop, the role offered, who sent it, the address it went to, and until when it holds.',
    },
    refusals: {
      404: 'The link is not valid or has been used (code invitation_unknown).',
      410: 'The invitation has expired (code invitation_expired).',
    },
  },
  {
    method: 'post',
    path: '/api/invitations/{token}/accept',
    tag: 'Invitations',
    summary: 'Accept an invitation',
    access: 'signed-in',
    accessNote: 'Only with the account of the address the invitation went to.',
    success: { status: 200, description: 'The workshop joined, with the new role in it.' },
    refusals: {
      403: 'The invitation went to another address (code invitation_other_email).',
      404: 'The link is not valid or has been used (code invitation_unknown).',
      410: 'The invitation has expired (code invitation_expired).',
    },
  },
  {
    method: 'get',
    path: `${w}/builds`,
    tag: 'Builds',
    summary: 'List the builds of a workshop',
    access: 'view',
    success: { status: 200, description: 'The builds, in the order they last changed.' },
  },
  {
    method: 'post',
    path: `${w}/builds`,
    tag: 'Builds',
    summary: 'Add a build',
    access: 'write-builds',
    body: newBuildSchema,
    success: { status: 201, description: 'The build as recorded.' },
    refusals: { 409: ID_TAKEN, 422: COVER_REFUSED },
  },
  {
    method: 'get',
    path: `${w}/builds/{buildId}`,
    tag: 'Builds',
    summary: 'Get a build',
    access: 'view',
    success: { status: 200, description: 'The build.' },
    refusals: { 404: noSuch('build') },
  },
  {
    method: 'patch',
    path: `${w}/builds/{buildId}`,
    tag: 'Builds',
    summary: 'Change a build',
    access: 'write-builds',
    body: buildPatchSchema,
    success: { status: 200, description: 'The build as changed.' },
    refusals: { 404: noSuch('build'), 422: COVER_REFUSED },
  },
  {
    method: 'delete',
    path: `${w}/builds/{buildId}`,
    tag: 'Builds',
    summary: 'Delete a build',
    access: 'write-builds',
    success: { status: 204, description: 'Deleted, with its photos.' },
    refusals: { 404: noSuch('build') },
  },
  {
    method: 'get',
    path: `${w}/builds/{buildId}/steps`,
    tag: 'Builds',
    summary: 'List the steps of a build',
    access: 'view',
    success: { status: 200, description: 'The steps logged on the build, in the order they last changed.' },
    refusals: { 404: noSuch('build') },
  },
  {
    method: 'post',
    path: `${w}/steps`,
    tag: 'Builds',
    summary: 'Log a step on a build',
    access: 'write-builds',
    body: newStepSchema,
    success: { status: 201, description: 'The step as recorded.' },
    refusals: { 404: noSuch('build'), 409: ID_TAKEN },
  },
  {
    method: 'patch',
    path: `${w}/steps/{stepId}`,
    tag: 'Builds',
    summary: 'Change a step',
    access: 'write-builds',
    body: stepPatchSchema,
    success: { status: 200, description: 'The step as changed.' },
    refusals: { 404: noSuch('step') },
  },
  {
    method: 'delete',
    path: `${w}/steps/{stepId}`,
    tag: 'Builds',
    summary: 'Delete a step',
    access: 'write-builds',
    success: { status: 204, description: 'Deleted.' },
    refusals: { 404: noSuch('step') },
  },
  {
    method: 'get',
    path: `${w}/shelf`,
    tag: 'Shelf',
    summary: 'See the shelf',
    access: 'view',
    success: {
      status: 200,
      description:
        'Each material with its containers, how much is left in each, and which are low, near their use-by date or past it.',
    },
  },
  {
    method: 'get',
    path: `${w}/materials`,
    tag: 'Shelf',
    summary: 'List the materials of a workshop',
    access: 'view',
    success: { status: 200, description: 'The materials with their data sheets, in the order they last changed.' },
  },
  {
    method: 'post',
    path: `${w}/materials`,
    tag: 'Shelf',
    summary: 'Add a material with its data sheet',
    access: 'write-builds',
    body: newMaterialSchema,
    success: { status: 201, description: 'The material as recorded.' },
    refusals: { 409: ID_TAKEN },
  },
  {
    method: 'get',
    path: `${w}/materials/{materialId}`,
    tag: 'Shelf',
    summary: 'Get a material',
    access: 'view',
    success: { status: 200, description: 'The material.' },
    refusals: { 404: noSuch('material') },
  },
  {
    method: 'patch',
    path: `${w}/materials/{materialId}`,
    tag: 'Shelf',
    summary: 'Change a material',
    access: 'write-builds',
    body: materialPatchSchema,
    success: { status: 200, description: 'The material as changed.' },
    refusals: { 404: noSuch('material') },
  },
  {
    method: 'delete',
    path: `${w}/materials/{materialId}`,
    tag: 'Shelf',
    summary: 'Delete a material',
    access: 'write-builds',
    success: { status: 204, description: 'Deleted.' },
    refusals: { 404: noSuch('material') },
  },
  {
    method: 'post',
    path: `${w}/containers`,
    tag: 'Shelf',
    summary: 'Put a container of a material on the shelf',
    access: 'write-builds',
    body: newContainerSchema,
    success: { status: 201, description: 'The container, full; its purchase is the first entry in its stock book.' },
    refusals: { 404: noSuch('material'), 409: ID_TAKEN },
  },
  {
    method: 'get',
    path: `${w}/containers/{containerId}`,
    tag: 'Shelf',
    summary: 'Get a container',
    access: 'view',
    success: { status: 200, description: 'The container.' },
    refusals: { 404: noSuch('container') },
  },
  {
    method: 'patch',
    path: `${w}/containers/{containerId}`,
    tag: 'Shelf',
    summary: 'Change a container',
    access: 'write-builds',
    body: containerPatchSchema,
    success: { status: 200, description: 'The container as changed.' },
    refusals: { 404: noSuch('container') },
  },
  {
    method: 'delete',
    path: `${w}/containers/{containerId}`,
    tag: 'Shelf',
    summary: 'Take a container off the shelf',
    access: 'write-builds',
    success: { status: 204, description: 'Deleted.' },
    refusals: { 404: noSuch('container') },
  },
  {
    method: 'post',
    path: `${w}/containers/{containerId}/waste`,
    tag: 'Shelf',
    summary: 'Record material spilt, skinned over or gone off',
    access: 'write-builds',
    body: wasteSchema,
    success: { status: 201, description: 'The stock-book entry: taken off the stock and costed, charged to no build.' },
    refusals: { 404: noSuch('container'), 409: ID_TAKEN },
  },
  {
    method: 'post',
    path: `${w}/containers/{containerId}/stocktake`,
    tag: 'Shelf',
    summary: 'Record what a container really holds',
    access: 'write-builds',
    body: stocktakeSchema,
    success: { status: 201, description: 'The stock-book entry, recorded as the difference from what was expected.' },
    refusals: { 404: noSuch('container'), 409: ID_TAKEN },
  },
  {
    method: 'get',
    path: `${w}/builds/{buildId}/pours`,
    tag: 'Pours',
    summary: 'List the pours of a build',
    access: 'view',
    success: { status: 200, description: 'The pours of the build, in the order they last changed.' },
    refusals: { 404: noSuch('build') },
  },
  {
    method: 'post',
    path: `${w}/pours`,
    tag: 'Pours',
    summary: 'Record a pour, drawing what it needs from the shelf',
    access: 'write-builds',
    body: newPourSchema,
    success: { status: 201, description: 'The pour with its plan and what it took from which containers.' },
    refusals: {
      400: "The pour cannot be planned with the material's data sheet; `fields` says why.",
      404: 'There is no such build, material or container in this workshop (code not_found).',
      409: `The shelf holds too little and \`whenShort\` is refuse (code stock_short). ${ID_TAKEN}`,
    },
  },
  {
    method: 'get',
    path: `${w}/pours/{pourId}`,
    tag: 'Pours',
    summary: 'Get a pour',
    access: 'view',
    success: { status: 200, description: 'The pour.' },
    refusals: { 404: noSuch('pour') },
  },
  {
    method: 'delete',
    path: `${w}/pours/{pourId}`,
    tag: 'Pours',
    summary: 'Delete a pour, putting what it took back on the shelf',
    access: 'write-builds',
    success: { status: 204, description: 'Deleted; the stock it used counts as on the shelf again.' },
    refusals: { 404: noSuch('pour') },
  },
  ...POUR_ROUTES,
  ...PHOTO_ROUTES,
  ...REMINDER_ROUTES,
  {
    method: 'get',
    path: `${w}/costs`,
    tag: 'Costs and export',
    summary: 'See what was used and wasted, and what it cost',
    access: 'view',
    success: {
      status: 200,
      description:
        'What was used and wasted, per build, material, month and in all; currencies are never added together.',
    },
  },
  {
    method: 'get',
    path: `${w}/costs.csv`,
    tag: 'Costs and export',
    summary: 'Download the costs as a spreadsheet (CSV)',
    access: 'view',
    success: { status: 200, description: 'The cost report as CSV, as a download.', media: 'text/csv' },
  },
  {
    method: 'get',
    path: `${w}/export.json`,
    tag: 'Costs and export',
    summary: "Download all of a workshop's records as JSON",
    access: 'export',
    success: { status: 200, description: 'Every table of the workshop, as a download.' },
  },
  {
    method: 'get',
    path: `${w}/export/{table}.csv`,
    tag: 'Costs and export',
    summary: 'Download one table of a workshop as CSV',
    access: 'export',
    success: { status: 200, description: 'The table as CSV, as a download.', media: 'text/csv' },
    refusals: { 404: `There is no such table; choose one of ${Object.keys(EXPORT_TABLES).join(', ')}.` },
  },
  {
    method: 'post',
    path: '/api/sync/push',
    tag: 'Sync',
    summary: "Send a device's waiting changes, oldest first",
    access: 'view',
    accessNote: "Each change is then checked on its own: a viewer's writes are answered as rejected.",
    body: pushRequestSchema,
    success: {
      status: 200,
      description:
        'One answer per change, in order: applied with its change number, or rejected with the reason. A change sent again answers as the first time.',
    },
    refusals: {
      503: 'Nothing was saved this time (code try_again); send the same changes again after `retryAfterMinutes` at the soonest.',
    },
  },
  {
    method: 'get',
    path: '/api/sync/pull',
    tag: 'Sync',
    summary: 'Fetch what changed in a workshop after a cursor',
    access: 'signed-in',
    query: pullQuerySchema,
    success: {
      status: 200,
      description:
        'A page of changed records (tombstones included) with the next cursor, or startOver when the device must copy everything again.',
    },
    refusals: {
      503: 'Nothing could be read this time (code try_again); ask again after `retryAfterMinutes` at the soonest.',
    },
  },
];

/** Every error the API sends has this shape (ApiErrorBody in shared/account-schemas.ts). */
const apiErrorSchema: z.ZodType<ApiErrorBody> = z.object({
  error: z.object({
    code: z.string().meta({ description: 'Stable, for programs: invalid, signed_out, forbidden, not_found…' }),
    message: z.string().meta({ description: 'For people, in plain words.' }),
    fields: z
      .record(z.string(), z.string())
      .optional()
      .meta({ description: 'On code invalid: what to fix, by field path (shape.lengthMm).' }),
    retryAfterMinutes: z
      .int()
      .positive()
      .optional()
      .meta({ description: 'On codes rate_limited and try_again: wait at least this long before trying again.' }),
  }),
});

let built: OpenApiDocument | undefined;

/** The document, built on first use: naming a schema registers it with zod, which allows one name once. */
export function openApiDocument(): OpenApiDocument {
  built ??= buildDocument();
  return built;
}

function buildDocument(): OpenApiDocument {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'session', {
    type: 'apiKey',
    in: 'cookie',
    name: SESSION_COOKIE,
    description: 'Set by POST /api/auth/sign-in; browsers send it by themselves.',
  });
  const apiError = apiErrorSchema.meta({ id: 'ApiError' });
  // .meta() names a copy that shares the shared schema's definition: the same checks, untouched.
  const named = new Map([...BODY_NAMES].map(([schema, id]) => [schema, schema.meta({ id })]));
  for (const route of API_ROUTES) registry.registerPath(operation(route, named, apiError));
  return new OpenApiGeneratorV3(registry.definitions).generateDocument({
    openapi: '3.0.3',
    info: {
      title: 'Benchtide API',
      version: '1',
      description:
        'The API the Benchtide app syncs with. Request bodies are JSON; state-changing requests from pages on other sites are refused.',
    },
    tags: TAGS.map((tag) => ({ ...tag })),
  });
}

function operation(route: ApiRoute, named: Map<z.ZodType, z.ZodType>, apiError: z.ZodType): RouteConfig {
  const access = accessOf(route);
  const params = pathParameters(route.path);
  const body = route.body && named.get(route.body);
  if (route.body && !body) throw new Error(`Name the body of ${route.method} ${route.path} in BODY_NAMES.`);
  const media = route.success.media ?? 'application/json';
  const responses: RouteConfig['responses'] = {
    [route.success.status]: {
      description: route.success.description,
      ...(route.success.status === 204 ? {} : { content: { [media]: {} } }),
    },
  };
  for (const [status, description] of Object.entries(route.otherAnswers ?? {})) {
    responses[status] = { description, content: { 'application/json': {} } };
  }
  for (const [status, description] of Object.entries(refusalsOf(route, access))) {
    responses[status] = { description, content: { 'application/json': { schema: apiError } } };
  }
  return {
    method: route.method,
    path: route.path,
    tags: [route.tag],
    summary: route.summary,
    description: access.who,
    security: access.signInNeeded ? [{ session: [] }] : [],
    [ACCESS_EXTENSION]: access,
    request: {
      ...(params ? { params } : {}),
      ...(route.query ? { query: route.query } : {}),
      ...(body
        ? { body: { required: true, content: { [route.bodyMedia ?? 'application/json']: { schema: body } } } }
        : {}),
    },
    responses,
  };
}

function pathParameters(path: string): z.ZodObject | undefined {
  const names = [...path.matchAll(/\{(\w+)\}/g)].map((match) => match[1]!);
  if (names.length === 0) return undefined;
  return z.object(
    Object.fromEntries(
      names.map((name) => {
        const schema = PATH_PARAMETERS[name];
        if (!schema) throw new Error(`Describe the path parameter {${name}} in PATH_PARAMETERS.`);
        return [name, schema];
      }),
    ),
  );
}

function accessOf(route: ApiRoute): OperationAccess {
  const note = route.accessNote ? ` ${route.accessNote}` : '';
  if (route.access === 'anyone') return { signInNeeded: false, who: `Anyone, signed in or not.${note}` };
  if (route.access === 'signed-in') return { signInNeeded: true, who: `Anyone signed in.${note}` };
  const action = route.access;
  const roles = ROLES.filter((role) => may(role, action));
  const plural = roles.map((role) => `${role}s`);
  const who =
    roles.length === ROLES.length
      ? `Any member of the workshop: ${inWords(roles, 'or')}.`
      : `${capitalised(inWords(plural, 'and'))} of the workshop.`;
  return { signInNeeded: true, roles, who: who + note };
}

export function inWords(words: readonly string[], conjunction: 'and' | 'or'): string {
  return words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} ${conjunction} ${words.at(-1)}`;
}

function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The refusals any route of this kind can give, then the route's own; both said where they share a status. */
function refusalsOf(route: ApiRoute, access: OperationAccess): Record<number, string> {
  const refusals: Record<number, string[]> = {};
  const add = (status: number, description: string) => (refusals[status] ??= []).push(description);
  if (route.body && route.bodyMedia) {
    add(400, 'Some values need another look (code invalid): `fields` says what to fix in each.');
  } else if (route.body) {
    add(
      400,
      'Some values need another look (code invalid): `fields` says what to fix in each. Or the body is not JSON (code malformed_json).',
    );
    add(413, 'The body is larger than the server accepts (code body_too_large).');
  }
  if (access.signInNeeded) add(401, 'Not signed in, or the session has ended (code signed_out).');
  if (route.method !== 'get') add(403, 'Sent from a page on another site (code cross_site).');
  if (access.roles && access.roles.length < ROLES.length) {
    add(403, 'Your role in this workshop may not do this (code forbidden).');
  }
  if (access.roles) {
    add(404, 'You are not a member of this workshop (code workshop_unknown), or an id in the path is malformed.');
  }
  for (const [status, description] of Object.entries(route.refusals ?? {})) add(Number(status), description);
  add(500, 'Something went wrong on the server; nothing was saved (code internal).');
  return Object.fromEntries(Object.entries(refusals).map(([status, texts]) => [status, texts.join(' ')]));
}
