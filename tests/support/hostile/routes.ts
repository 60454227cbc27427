import { randomUUID } from 'node:crypto';
import { checklistItems } from '../../../shared/schemas/burn';
import { PASSWORD, uniqueEmail } from '../accounts';
import { pairsFile } from './csv';
import type { Credentials, LabWorld } from './world';

// For every write route: a valid request against lab A (with every optional field filled, so
// each one is a place to break). Hostile cases are made from these by the OpenAPI schemas.

export type ValidRequest = {
  params?: Record<string, string>;
  body?: unknown;
  /** Signed in as lab A's manager (bearer), or anonymous. */
  auth?: 'bearer' | 'none';
  /** Body paths of client-made ids (`*` for any array index). */
  clientIdPaths?: string[];
  tokenParams?: string[];
};

type Builder = (a: LabWorld, own: Credentials) => ValidRequest;

const lab = (a: LabWorld) => ({ labId: a.labId });

const recipeBody = (a: LabWorld) => ({
  name: 'Borax and boric acid 7:3',
  substrate: 'cotton',
  ingredients: [
    { chemicalId: a.chemicalId, amount: 7, unit: 'parts' },
    { chemicalId: a.boricId, amount: 3, unit: 'parts' },
  ],
  waterParts: 90,
  mixingTempC: 40,
  soakMinutes: 15,
  drainMinutes: 5,
  dryingMethod: 'rack',
  dryingMinutes: 600,
  dryingTempC: 22,
  dryingRhPct: 50,
  conditioning: '24 h at 23 °C',
  notes: 'Stir until clear',
});

const profileBody = {
  name: 'House limits',
  description: 'Our own pass rules',
  source: 'Lab handbook, edition 2',
  minSpecimens: 3,
  exposureS: 12,
  rules: [
    { kind: 'max_char_length_mm', limit: 150, appliesTo: 'average' },
    { kind: 'no_flaming_drips', appliesTo: 'each' },
  ],
};

const measurement = {
  charLengthMm: 85,
  charWidthMm: 20,
  massBeforeG: 4,
  massAfterG: 3.2,
  flamingDrips: false,
  notes: 'Even char',
};

export const validRequests: Record<string, Builder> = {
  'POST /api/auth/sign-up': () => ({
    auth: 'none',
    body: {
      email: uniqueEmail('new'),
      password: PASSWORD,
      displayName: 'New Person',
      labName: 'New lab',
    },
  }),
  'POST /api/auth/sign-in': (a) => ({
    auth: 'none',
    body: { email: a.manager.email, password: PASSWORD, tokenDelivery: 'body' },
  }),
  'POST /api/auth/refresh': (_a, own) => ({
    auth: 'none',
    body: { refreshToken: own.refreshToken, tokenDelivery: 'body' },
  }),
  'POST /api/auth/sign-out': () => ({}),
  'POST /api/auth/sign-out-everywhere': () => ({}),
  'POST /api/auth/password': () => ({
    // The same password again: later routes still sign in with it.
    body: { currentPassword: PASSWORD, newPassword: PASSWORD },
  }),
  'POST /api/auth/password-reset/request': (a) => ({
    auth: 'none',
    body: { email: a.manager.email },
  }),
  'POST /api/auth/password-reset/confirm': (a) => ({
    auth: 'none',
    body: { token: a.resetToken, newPassword: 'a different long password' },
  }),
  'PATCH /api/me': () => ({ body: { displayName: 'Renamed Person', units: 'us' } }),
  'POST /api/invitations/{token}/accept': (a) => ({
    auth: 'none',
    params: { token: a.invitationToken },
    body: { displayName: 'Invited Person', password: 'an invited long password' },
    tokenParams: ['token'],
  }),
  'POST /api/labs': () => ({ body: { name: 'A second lab' } }),
  'PATCH /api/labs/{labId}/members/{userId}': (a) => ({
    params: { ...lab(a), userId: a.viewerId },
    body: { role: 'technician' },
  }),
  'DELETE /api/labs/{labId}/members/{userId}': (a) => ({
    params: { ...lab(a), userId: a.viewerId },
  }),
  'POST /api/labs/{labId}/invitations': (a) => ({
    params: lab(a),
    body: { email: uniqueEmail('invitee'), role: 'reviewer' },
  }),
  'DELETE /api/labs/{labId}/invitations/{invitationId}': (a) => ({
    params: { ...lab(a), invitationId: a.invitationId },
  }),
  'POST /api/labs/{labId}/chemicals': (a) => ({
    params: lab(a),
    body: {
      name: `Ammonium sulfate ${randomUUID().slice(0, 6)}`,
      formula: '(NH4)2SO4',
      molarMass: 132.14,
      boronPercent: 0,
      hazards: [{ code: 'H319', text: 'Causes serious eye irritation' }],
      notes: 'Lab grade',
      solubility: {
        basis: 'g_per_100g_water',
        points: [
          { tempC: 0, value: 70.6 },
          { tempC: 20, value: 75.4 },
        ],
        source: 'Supplier data sheet',
      },
    },
  }),
  'POST /api/labs/{labId}/recipes': (a) => ({ params: lab(a), body: recipeBody(a) }),
  'PUT /api/labs/{labId}/recipes/{recipeId}': (a) => ({
    params: { ...lab(a), recipeId: a.recipeId },
    body: recipeBody(a),
  }),
  'POST /api/labs/{labId}/batch-plans': (a) => ({
    params: lab(a),
    body: {
      recipeRevisionId: a.revisionId,
      storageTempC: 20,
      target: { basis: 'water_mass', grams: 500 },
    },
  }),
  'POST /api/labs/{labId}/batches': (a) => ({
    params: lab(a),
    body: {
      clientId: randomUUID(),
      recipeRevisionId: a.revisionId,
      target: { basis: 'water_volume', millilitres: 800 },
      storageTempC: 25,
      waterTempC: 40,
      ph: 7.2,
      densityGMl: 1.03,
      weighIns: [{ chemicalId: a.chemicalId, weighedG: 32, lot: 'L-2291' }],
      cautionsAcknowledged: true,
      notes: 'Mixed in the big pail',
    },
    clientIdPaths: ['clientId'],
  }),
  'PATCH /api/labs/{labId}/batches/{batchId}': (a) => ({
    params: { ...lab(a), batchId: a.spareBatchId },
    body: { status: 'discarded', discardReason: 'Crystals formed', notes: 'Too cold overnight' },
  }),
  'POST /api/labs/{labId}/batches/{batchId}/specimens': (a) => ({
    params: { ...lab(a), batchId: a.batchId },
    body: {
      clientId: randomUUID(),
      code: `S-${randomUUID().slice(0, 6)}`,
      substrate: 'Muslin',
      lengthMm: 300,
      widthMm: 75,
      thicknessMm: 0.4,
      dryMassBeforeG: 4,
      wetMassG: 9,
      dryMassAfterG: 4.4,
      notes: 'Edge frayed',
    },
    clientIdPaths: ['clientId'],
  }),
  'PATCH /api/labs/{labId}/batches/{batchId}/specimens/{specimenId}': (a) => ({
    params: { ...lab(a), batchId: a.batchId, specimenId: a.specimenId },
    body: { wetMassG: 5, dryMassAfterG: 2.2, notes: 'Dried on the rack' },
  }),
  'PATCH /api/labs/{labId}/settings': (a) => ({ params: lab(a), body: { weighTolerancePct: 3 } }),
  'POST /api/labs/{labId}/burn-sessions': (a) => ({
    params: lab(a),
    body: {
      clientId: randomUUID(),
      heldAt: '2025-03-04T10:00:00.000Z',
      place: 'Fume hood 2',
      secondPerson: 'R. Ash',
      ambientTempC: 21,
      ambientRhPct: 45,
      draft: 'hood',
      wind: 'none',
      igniter: 'bunsen',
      igniterDetail: '38 mm flame',
      exposureS: 12,
      orientation: 'vertical',
      criteriaProfileId: a.profileId,
      notes: 'Morning run',
    },
    clientIdPaths: ['clientId'],
  }),
  'PATCH /api/labs/{labId}/burn-sessions/{sessionId}': (a) => ({
    params: { ...lab(a), sessionId: a.sessionId },
    body: {
      checklist: Object.fromEntries(checklistItems.map((i) => [i.key, true])),
      notes: 'All set',
    },
  }),
  'POST /api/labs/{labId}/burn-sessions/{sessionId}/pairs': (a) => ({
    params: { ...lab(a), sessionId: a.sessionId },
    body: {
      clientId: randomUUID(),
      treatedSpecimenId: a.unpairedSpecimenId,
      control: {
        clientId: randomUUID(),
        code: `C-${randomUUID().slice(0, 6)}`,
        substrate: 'Muslin',
        lengthMm: 300,
        widthMm: 75,
        thicknessMm: 0.4,
        dryMassG: 4.1,
        conditioning: '24 h at 23 °C',
      },
      mode: 'sequential',
    },
    clientIdPaths: ['clientId', 'control.clientId'],
  }),
  'POST /api/labs/{labId}/pairs/{pairId}/marks': (a) => ({
    params: { ...lab(a), pairId: a.draftPair.id },
    body: {
      marks: [
        { id: randomUUID(), specimenId: a.draftPair.treatedId, kind: 'flame_applied', atMs: 1000 },
        {
          id: randomUUID(),
          specimenId: a.draftPair.controlId,
          kind: 'undo',
          atMs: 2500,
          undoes: a.draftPair.markId,
        },
      ],
    },
    clientIdPaths: ['marks.*.id'],
  }),
  'PUT /api/labs/{labId}/pairs/{pairId}/measurements/{specimenId}': (a) => ({
    params: { ...lab(a), pairId: a.draftPair.id, specimenId: a.draftPair.treatedId },
    body: measurement,
  }),
  'POST /api/labs/{labId}/pairs/{pairId}/submit': (a) => ({
    params: { ...lab(a), pairId: a.draftPair.id },
  }),
  'POST /api/labs/{labId}/pairs/{pairId}/sign-off': (a) => ({
    params: { ...lab(a), pairId: a.submittedPairIds[0] },
  }),
  'POST /api/labs/{labId}/pairs/{pairId}/return': (a) => ({
    params: { ...lab(a), pairId: a.submittedPairIds[1] },
    body: { comment: 'Measure the char again' },
  }),
  'POST /api/labs/{labId}/pairs/{pairId}/corrections': (a) => ({
    params: { ...lab(a), pairId: a.signedOffPair.id },
    body: {
      specimenId: a.signedOffPair.treatedId,
      changes: measurement,
      reason: 'Misread the ruler',
    },
  }),
  'POST /api/labs/{labId}/pairs/{pairId}/photos': (a) => ({
    params: { ...lab(a), pairId: a.draftPair.id },
    body: { clientId: randomUUID(), specimenId: a.draftPair.controlId, stage: 'after' },
    clientIdPaths: ['clientId'],
  }),
  'POST /api/labs/{labId}/criteria-profiles': (a) => ({ params: lab(a), body: profileBody }),
  'POST /api/labs/{labId}/criteria-profiles/copy-preset': (a) => ({
    params: lab(a),
    body: { presetKey: 'fmvss-302' },
  }),
  'PUT /api/labs/{labId}/criteria-profiles/{profileId}': (a) => ({
    params: { ...lab(a), profileId: a.profileId },
    body: { ...profileBody, name: 'House limits, revised' },
  }),
  'DELETE /api/labs/{labId}/criteria-profiles/{profileId}': (a) => ({
    params: { ...lab(a), profileId: a.spareProfileId },
  }),
  'POST /api/labs/{labId}/pair-imports/preview': (a) => ({
    params: lab(a),
    body: pairsFile(a.importRecipeName),
  }),
  'POST /api/labs/{labId}/pair-imports/{importId}/accept': (a) => ({
    params: { ...lab(a), importId: a.importId },
  }),
  'DELETE /api/labs/{labId}/pair-imports/{importId}': (a) => ({
    params: { ...lab(a), importId: a.spareImportId },
  }),
};
