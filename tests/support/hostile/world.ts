import { randomUUID } from 'node:crypto';
import path from 'node:path';
import request from 'supertest';
import sharp from 'sharp';
import { createDiskPhotoStore } from '../../../server/photos/store';
import {
  addMarks,
  putMeasurement,
  signOffPair,
  submitPair,
} from '../../../server/services/burn-tests';
import { ChemicalModel } from '../../../server/models';
import { requestPasswordReset } from '../../../server/services/accounts';
import { createChemical } from '../../../server/services/chemicals';
import { copyPreset } from '../../../server/services/criteria-profiles';
import { createInvitation } from '../../../server/services/invitations';
import { addPhoto } from '../../../server/services/photos';
import { addSpecimen, createBatch } from '../../../server/services/batches';
import { previewImport } from '../../../server/services/pair-imports';
import { createRecipe } from '../../../server/services/recipes';
import type { OutgoingMail } from '../../../server/mail/types';
import { memberWithRole, signUpPerson, uniqueEmail, PASSWORD } from '../accounts';
import type { TestApp } from '../app';
import { sessionWithPair, treatedSpecimen } from '../burn';
import { pairsFile } from './csv';

/** One lab's records, made through the services as its manager: the targets of every write. */
export type LabWorld = {
  labId: string;
  manager: { userId: string; email: string };
  viewerId: string;
  invitationId: string;
  invitationToken: string;
  resetToken: string;
  chemicalId: string;
  boricId: string;
  recipeId: string;
  /** A recipe no write route renames or revises: the one the pairs files name. */
  importRecipeName: string;
  revisionId: string;
  batchId: string;
  spareBatchId: string;
  specimenId: string;
  unpairedSpecimenId: string;
  sessionId: string;
  draftPair: { id: string; controlId: string; treatedId: string; markId: string };
  submittedPairIds: [string, string];
  signedOffPair: { id: string; treatedId: string };
  profileId: string;
  spareProfileId: string;
  photoId: string;
  /** Previewed pairs files waiting in the lab: one to accept, one to discard. */
  importId: string;
  spareImportId: string;
};

export type World = { a: LabWorld; b: LabWorld };

export function smallJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 16, height: 12, channels: 3, background: '#a0522d' } })
    .jpeg()
    .toBuffer();
}

export type Credentials = { token: string; refreshToken: string; accessCookie: string };

/** A session of its own (bearer and refresh tokens, and an access cookie for the web). */
export async function signInTokens(t: TestApp, email: string): Promise<Credentials> {
  const res = await request(t.app)
    .post('/api/auth/sign-in')
    .send({ email, password: PASSWORD, tokenDelivery: 'body' });
  const cookie = await request(t.app).post('/api/auth/sign-in').send({ email, password: PASSWORD });
  const access = (cookie.headers['set-cookie'] as unknown as string[]).find((c) =>
    c.startsWith('qb_access='),
  );
  return {
    token: res.body.accessToken as string,
    refreshToken: res.body.refreshToken as string,
    accessCookie: access!.split(';')[0]!,
  };
}

/** The services' own mail, kept in memory so a test can follow the link in it. */
function capturingDeps(t: TestApp) {
  const sent: OutgoingMail[] = [];
  const mailer = { send: async (m: OutgoingMail) => void sent.push(m), close() {} };
  const tokenIn = (pattern: RegExp) => decodeURIComponent(pattern.exec(sent.at(-1)!.text)![1]!);
  return { deps: { ...t.deps, mailer }, tokenIn };
}

async function invitationWithToken(t: TestApp, labId: string, actorId: string) {
  const { deps, tokenIn } = capturingDeps(t);
  const invitation = await createInvitation(
    deps,
    labId,
    { email: uniqueEmail('invitee'), role: 'viewer' },
    { id: actorId, ip: null },
  );
  return { id: invitation.id, token: tokenIn(/\/invitations\/([^\s"<]+)/) };
}

async function resetToken(t: TestApp, email: string): Promise<string> {
  const { deps, tokenIn } = capturingDeps(t);
  await requestPasswordReset(deps, email, { ip: null, userAgent: null });
  return tokenIn(/[?&]token=([^\s"<&]+)/);
}

export async function makeLabWorld(t: TestApp, name: string): Promise<LabWorld> {
  const lead = await signUpPerson(t, name);
  const { labId, userId, email } = lead;
  const viewer = await memberWithRole(t, labId, 'viewer');
  const invitation = await invitationWithToken(t, labId, userId);
  const toAccept = await invitationWithToken(t, labId, userId);
  const chemical = await createChemical(labId, { name: `Salt ${randomUUID().slice(0, 8)}` });
  const recipe = await createRecipe(labId, userId, {
    name: `Recipe ${randomUUID().slice(0, 8)}`,
    substrate: 'paper',
    ingredients: [{ chemicalId: chemical.id, amount: 4, unit: 'g_per_100g_water' }],
    mixingTempC: 30,
    soakMinutes: 10,
    dryingMethod: 'air',
  });
  const batchInput = () => ({
    clientId: randomUUID(),
    recipeRevisionId: recipe.current.id,
    target: { basis: 'water_mass' as const, grams: 1000 },
    storageTempC: 25,
    weighIns: [{ chemicalId: chemical.id, weighedG: 40 }],
    cautionsAcknowledged: true as const,
  });
  const { batch } = await createBatch(labId, userId, batchInput());
  const spare = await createBatch(labId, userId, batchInput());
  const specimen = await addSpecimen(labId, batch.id, {
    clientId: randomUUID(),
    code: `S-${randomUUID().slice(0, 6)}`,
    substrate: 'paper',
    dryMassBeforeG: 2,
  });
  const unpaired = await treatedSpecimen(labId, userId);
  const draft = await sessionWithPair(labId, email);
  const markId = randomUUID();
  await addMarks(labId, draft.pair.id, userId, {
    marks: [{ id: markId, specimenId: draft.controlId, kind: 'flame_applied', atMs: 0 }],
  });
  const submitted = [await sessionWithPair(labId, email), await sessionWithPair(labId, email)];
  for (const s of submitted) await submitPair(labId, s.pair.id, userId);
  const signed = await sessionWithPair(labId, email);
  await putMeasurement(labId, signed.pair.id, signed.treatedId, { charLengthMm: 80 });
  await submitPair(labId, signed.pair.id, userId);
  await signOffPair(labId, signed.pair.id, userId);
  const profile = await copyPreset(labId, 'ul94-v0');
  const spareProfile = await copyPreset(labId, 'nfpa-701-tm1');
  const store = createDiskPhotoStore(path.join(t.config.dataDir, 'photos'));
  const { photo } = await addPhoto(
    store,
    labId,
    draft.pair.id,
    userId,
    { clientId: randomUUID(), specimenId: draft.controlId, stage: 'before' },
    await smallJpeg(),
  );
  const importRecipe = await createRecipe(labId, userId, {
    name: `Imported recipe ${randomUUID().slice(0, 8)}`,
    substrate: 'cotton',
    ingredients: [{ chemicalId: chemical.id, amount: 5, unit: 'g_per_100g_water' }],
    mixingTempC: 30,
    soakMinutes: 10,
    dryingMethod: 'air',
  });
  const pairsImport = () =>
    previewImport(labId, userId, 'world.csv', pairsFile(importRecipe.name, 2));
  const [toAcceptImport, spareImport] = [await pairsImport(), await pairsImport()];
  const boric = await ChemicalModel.findOne({ where: { labId: null, referenceKey: 'boric-acid' } });
  return {
    labId,
    manager: { userId, email },
    viewerId: viewer.userId,
    invitationId: invitation.id,
    invitationToken: toAccept.token,
    resetToken: await resetToken(t, viewer.email),
    chemicalId: chemical.id,
    boricId: boric!.id,
    recipeId: recipe.id,
    importRecipeName: importRecipe.name,
    revisionId: recipe.current.id,
    batchId: batch.id,
    spareBatchId: spare.batch.id,
    specimenId: specimen.specimen.id,
    unpairedSpecimenId: unpaired.id,
    sessionId: draft.session.id,
    draftPair: {
      id: draft.pair.id,
      controlId: draft.controlId,
      treatedId: draft.treatedId,
      markId,
    },
    submittedPairIds: [submitted[0]!.pair.id, submitted[1]!.pair.id],
    signedOffPair: { id: signed.pair.id, treatedId: signed.treatedId },
    profileId: profile.id,
    spareProfileId: spareProfile.id,
    photoId: photo.id,
    importId: toAcceptImport.importId,
    spareImportId: spareImport.importId,
  };
}

/** Every id of a lab's own records: what "an id of another lab" can be. */
export function idsOf(lab: LabWorld): string[] {
  return [
    lab.labId,
    lab.manager.userId,
    lab.viewerId,
    lab.invitationId,
    lab.chemicalId,
    lab.recipeId,
    lab.revisionId,
    lab.batchId,
    lab.spareBatchId,
    lab.specimenId,
    lab.unpairedSpecimenId,
    lab.sessionId,
    lab.draftPair.id,
    lab.draftPair.controlId,
    lab.draftPair.treatedId,
    lab.draftPair.markId,
    ...lab.submittedPairIds,
    lab.signedOffPair.id,
    lab.signedOffPair.treatedId,
    lab.profileId,
    lab.spareProfileId,
    lab.photoId,
    lab.importId,
    lab.spareImportId,
  ];
}
