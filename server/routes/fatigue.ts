import { Router } from 'express';

import { minerDamage, rainflow } from '@/features/fatigue';
import { damageRequestSchema, rainflowRequestSchema } from '@/features/fatigue/schema';
import { requireAuth, requireRole } from '@/server/auth/require-auth';
import type { ApiDeps } from '@/server/deps';
import { HttpError } from '@/server/http/errors';
import { fatigueJsonBody } from '@/server/http/json-body';
import { validate } from '@/server/http/validate';

/**
 * `POST /fatigue/rainflow` (ASTM E1049 §5.4.4 cycle counting) and `POST /fatigue/damage` (EN 1993-1-9
 * Palmgren–Miner sum): the pure engine of features/fatigue behind HTTP, for staff. They read and write
 * no stored data. Their bodies may hold a million values: they parse up to 32 MB, after sign-in.
 */
export function fatigueRouter(deps: ApiDeps): Router {
  const router = Router();
  // The large parser only after the token and role are checked (server/http/json-body.ts).
  const staff = [requireAuth(deps), requireRole('admin', 'supervisor', 'inspector'), fatigueJsonBody];
  const rainflowInput = validate({ body: rainflowRequestSchema });
  const damageInput = validate({ body: damageRequestSchema });

  router.post('/fatigue/rainflow', ...staff, rainflowInput, (_req, res) => {
    res.json({ cycles: rainflow(rainflowInput.body(res).series) });
  });

  router.post('/fatigue/damage', ...staff, damageInput, (_req, res) => {
    const body = damageInput.body(res);
    // A series is counted first; its half cycles enter the sum with count 0.5.
    const cycles = body.series
      ? rainflow(body.series).map((c) => ({ rangeMPa: c.range, count: c.count }))
      : (body.cycles ?? []);
    const result = minerDamage(cycles, {
      categoryMPa: body.detailCategoryMPa,
      shear: body.shear,
      gammaFf: body.gammaFf,
      gammaMf: body.gammaMf,
    });
    // Absurd magnitudes (a range of 1e200 MPa, a category of 1e-200) overflow the sum; JSON has no ∞.
    if (!Number.isFinite(result.damage)) {
      const path = body.series ? 'series' : 'cycles';
      throw new HttpError(400, 'validation_failed', 'Some fields are missing or invalid.', [
        {
          path,
          message: 'The damage is too large to compute: check the ranges, counts and detail category.',
        },
      ]);
    }
    res.json(result);
  });
  return router;
}
