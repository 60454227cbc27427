import { Op, type Transaction } from 'sequelize';
import { referenceChemicals } from '../../shared/chemistry/reference-chemicals';
import type { ChemicalData, Solubility } from '../../shared/chemistry/types';
import type { Chemical, CreateChemicalInput } from '../../shared/schemas/chemical';
import { createChemicalSchema } from '../../shared/schemas/chemical';
import { AppError } from '../errors';
import { ChemicalModel } from '../models';

/** Writes the reference chemicals (shared by every lab) from the code into the database. */
export async function syncReferenceChemicals(): Promise<void> {
  for (const c of referenceChemicals) {
    const values = {
      labId: null,
      referenceKey: c.key,
      name: c.name,
      formula: c.formula,
      molarMass: c.molarMass,
      boronFraction: c.boronFraction,
      hydrateWaterFraction: c.hydrateWaterFraction,
      anhydrousMolarMass: c.anhydrousMolarMass ?? null,
      borateGroup: c.borateGroup ?? null,
      hazards: c.hazards,
      cautions: c.cautions,
      solubility: c.solubility,
      notes: null,
    };
    const row = await ChemicalModel.findOne({ where: { labId: null, referenceKey: c.key } });
    if (row) await row.update(values);
    else await ChemicalModel.create(values);
  }
}

/** What the calculator needs; the key is the row id, so plans name chemicals by id. */
export function toChemicalData(row: ChemicalModel): ChemicalData {
  return {
    key: row.id,
    name: row.name,
    formula: row.formula ?? '',
    molarMass: row.molarMass ?? 0,
    boronFraction: row.boronFraction,
    hydrateWaterFraction: row.hydrateWaterFraction,
    ...(row.anhydrousMolarMass ? { anhydrousMolarMass: row.anhydrousMolarMass } : {}),
    ...(row.borateGroup ? { borateGroup: row.borateGroup } : {}),
    hazards: row.hazards,
    cautions: row.cautions as ChemicalData['cautions'],
    solubility: (row.solubility as Solubility | null) ?? null,
  };
}

function describeSolubility(s: Solubility): string {
  if (s.kind === 'mole_fraction_fit') return `Fitted curve, ${s.validFromC}–${s.validToC} °C`;
  const first = s.points[0]!;
  const last = s.points[s.points.length - 1]!;
  const unit = s.basis === 'mass_percent' ? '% of solution' : 'g per 100 g water';
  const anhydrous = s.solute === 'anhydrous' ? ' (anhydrous basis)' : '';
  return `Table of ${s.points.length} temperatures, ${first.tempC}–${last.tempC} °C, in ${unit}${anhydrous}`;
}

export function toChemical(row: ChemicalModel): Chemical {
  const s = (row.solubility as Solubility | null) ?? null;
  return {
    id: row.id,
    reference: row.labId === null,
    referenceKey: row.referenceKey,
    name: row.name,
    formula: row.formula,
    molarMass: row.molarMass,
    boronPercent: row.boronFraction === null ? null : row.boronFraction * 100,
    hazards: row.hazards,
    cautions: row.cautions,
    notes: row.notes,
    solubility: s
      ? {
          kind: s.kind,
          summary: describeSolubility(s),
          source: s.source,
          confidence: s.confidence,
          ...(s.kind === 'table' ? { points: s.points, basis: s.basis, solute: s.solute } : {}),
        }
      : null,
  };
}

const visibleTo = (labId: string) => ({ [Op.or]: [{ labId: null }, { labId }] });

export async function listChemicals(labId: string): Promise<Chemical[]> {
  const rows = await ChemicalModel.findAll({ where: visibleTo(labId), order: [['name', 'ASC']] });
  return rows.map(toChemical);
}

export async function getChemical(labId: string, chemicalId: string): Promise<Chemical> {
  const row = await ChemicalModel.findOne({ where: { id: chemicalId, ...visibleTo(labId) } });
  if (!row) throw AppError.notFound('No such chemical in this lab.');
  return toChemical(row);
}

/**
 * The chemicals a recipe or weigh-in names, each a reference chemical or the lab's own; an
 * id that is neither is a 400 on the field that named it.
 */
export async function chemicalsByIds(
  labId: string,
  ids: string[],
  fieldPath: (index: number) => string,
  transaction?: Transaction,
): Promise<Map<string, ChemicalModel>> {
  const rows = await ChemicalModel.findAll({
    where: { id: ids, ...visibleTo(labId) },
    transaction,
  });
  const found = new Map(rows.map((r) => [r.id, r]));
  const fields = ids.flatMap((id, i) =>
    found.has(id) ? [] : [{ path: fieldPath(i), message: 'Unknown chemical' }],
  );
  if (fields.length)
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
  return found;
}

export async function createChemical(labId: string, input: CreateChemicalInput): Promise<Chemical> {
  const v = createChemicalSchema.parse(input);
  const taken = await ChemicalModel.findOne({
    where: {
      ...visibleTo(labId),
      [Op.and]: [
        ChemicalModel.sequelize!.where(
          ChemicalModel.sequelize!.fn('lower', ChemicalModel.sequelize!.col('name')),
          v.name.toLowerCase(),
        ),
      ],
    },
  });
  if (taken) {
    throw new AppError(
      409,
      'already_exists',
      'A chemical with this name is already in the library.',
      [{ path: 'name', message: 'Already in the library' }],
    );
  }
  const solubility: Solubility | null = v.solubility
    ? {
        kind: 'table',
        basis: v.solubility.basis,
        solute: 'as_is',
        points: v.solubility.points,
        source: v.solubility.source,
        confidence: 'confirmed',
      }
    : null;
  const row = await ChemicalModel.create({
    labId,
    referenceKey: null,
    name: v.name,
    formula: v.formula ?? null,
    molarMass: v.molarMass ?? null,
    boronFraction: v.boronPercent === undefined ? null : v.boronPercent / 100,
    anhydrousMolarMass: null,
    borateGroup: null,
    hazards: v.hazards,
    cautions: ['dust', 'disposal'],
    solubility,
    notes: v.notes ?? null,
  });
  return toChemical(row);
}
