import { Router } from 'express';
import Papa from 'papaparse';
import { FORMULA_START } from '../../shared/csv/formulae';
import { criteriaPresets } from '../../shared/criteria/presets';
import { criteriaPresetListSchema } from '../../shared/schemas/criteria';
import { labParamsSchema } from '../../shared/schemas/lab';
import { rankingQuerySchema, rankingSchema } from '../../shared/schemas/ranking';
import { labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import { pairRowsForCsv, rankings, rankingsJson } from '../services/rankings';

const round = (v: number | null | undefined, digits = 2) =>
  v === null || v === undefined || !Number.isFinite(v)
    ? ''
    : String(Math.round(v * 10 ** digits) / 10 ** digits);

export function rankingsRouter(): Router {
  const router = Router();
  router.get(
    '/labs/:labId/rankings',
    requireLab('read'),
    validate({ query: rankingQuerySchema }),
    async (req, res) => {
      const { json, gzipped, etag } = await rankingsJson(labOf(res).id, res.locals.query);
      const gzip = req.acceptsEncodings('gzip', 'identity') === 'gzip';
      // Express answers 304 when the request's If-None-Match carries the tag.
      res.vary('Accept-Encoding').type('application/json');
      if (gzip) res.set({ 'Content-Encoding': 'gzip', ETag: etag.replace(/"$/, '-gz"') });
      else res.set('ETag', etag);
      res.send(gzip ? gzipped : json);
    },
  );
  router.get('/labs/:labId/criteria-presets', requireLab('read'), (_req, res) => {
    res.json({
      presets: criteriaPresets.map((p) => ({
        key: p.key,
        name: p.name,
        source: p.source ?? null,
        caution: p.caution,
        description: p.description ?? null,
      })),
    });
  });
  router.get(
    '/labs/:labId/rankings.csv',
    requireLab('read'),
    validate({ query: rankingQuerySchema }),
    async (_req, res) => {
      const r = await rankings(labOf(res).id, res.locals.query);
      const csv = Papa.unparse(
        [...r.ranked, ...r.notEnoughPairs].map((t) => ({
          rank: t.rank ?? '',
          recipe: t.recipeName,
          revision: t.revisionNumber,
          substrate: t.substrate,
          pairs: t.pairs,
          treated_char_mean_mm: round(t.treatedChar.mean),
          treated_char_sd_mm: round(t.treatedChar.sd),
          control_char_mean_mm: round(t.controlChar.mean),
          reduction_mean_mm: round(t.difference.mean),
          reduction_ci95_low_mm: round(t.difference.ci95?.[0]),
          reduction_ci95_high_mm: round(t.difference.ci95?.[1]),
          reduction_pct: round(t.difference.reductionPct),
          paired_t_p: round(t.difference.pairedP, 6),
          wilcoxon_p: round(t.difference.wilcoxonP, 6),
          self_extinguish_rate: round(t.selfExtinguish.rate, 4),
          afterflame_median_s: round(t.afterflameMedianS),
          afterglow_median_s: round(t.afterglowMedianS),
          verdict: t.verdict
            ? t.verdict.pass
              ? 'pass'
              : `fail: ${t.verdict.failed.join('; ') || t.verdict.notEnough}`
            : '',
        })),
        { escapeFormulae: FORMULA_START },
      );
      res.type('text/csv').attachment('ranking.csv').send(csv);
    },
  );
  router.get(
    '/labs/:labId/pairs.csv',
    requireLab('read'),
    validate({ query: rankingQuerySchema }),
    async (_req, res) => {
      const rows = await pairRowsForCsv(labOf(res).id, res.locals.query);
      const csv = Papa.unparse(
        rows.map((r) => {
          const lane = (who: 'control' | 'treated') => {
            const o = r[who];
            return {
              [`${who}_code`]: o.code,
              [`${who}_char_mm`]: round(o.charLengthMm, 1),
              [`${who}_afterflame_s`]: round(o.afterflameS),
              [`${who}_afterflame_complete`]: o.afterflameComplete,
              [`${who}_afterglow_s`]: round(o.afterglowS),
              [`${who}_burn_time_s`]: round(o.burnTimeS),
              [`${who}_burned_to_clamp`]: o.burnedToClamp,
              [`${who}_flaming_drips`]: o.flamingDrips ?? '',
            };
          };
          // The columns a pairs file imports by (shared/schemas/pair-import.ts).
          return {
            pair_id: r.pairId,
            held_at: r.heldAt,
            recipe: r.recipeName,
            revision: r.revisionNumber,
            substrate: r.substrate,
            exposure_s: r.exposureS,
            igniter: r.igniter,
            orientation: r.orientation,
            draft: r.draft,
            mode: r.mode,
            batch: r.batchCode,
            add_on_pct: round(r.addOnPct),
            ...lane('control'),
            ...lane('treated'),
            treated_mass_loss_pct: round(r.treated.massLossPct),
          };
        }),
        { escapeFormulae: FORMULA_START },
      );
      res.type('text/csv').attachment('pairs.csv').send(csv);
    },
  );
  return router;
}

export function registerRankingDocs(docs: ApiDocs): void {
  const member = 'any member of the lab';
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/rankings',
    summary:
      'Treatments ranked by char length, with statistics and verdicts (signed-off pairs unless unreviewed=true)',
    access: member,
    params: labParamsSchema,
    query: rankingQuerySchema,
    ok: { status: 200, schema: rankingSchema, description: 'The ranking' },
    errors: [400, 401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/rankings.csv',
    summary: 'The ranking as CSV',
    access: member,
    params: labParamsSchema,
    query: rankingQuerySchema,
    ok: { status: 200, description: 'text/csv' },
    errors: [400, 401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/pairs.csv',
    summary: 'The pairs behind the ranking as CSV',
    access: member,
    params: labParamsSchema,
    query: rankingQuerySchema,
    ok: { status: 200, description: 'text/csv' },
    errors: [400, 401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/criteria-presets',
    summary: 'Criteria presets built from published test methods',
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: criteriaPresetListSchema, description: 'Presets' },
    errors: [401, 404],
  });
}
