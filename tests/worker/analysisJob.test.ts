import { describe, expect, it } from 'vitest';
import { describeIfGirdle, runAnalysisJob } from '../../src/worker/analysisJob';
import { analyzeFold } from '../../src/core/foldAnalysis';

describe('describeIfGirdle', () => {
  it('describeIfGirdle refuses to describe a cluster of poles and says why', () => {
    // Five nearly parallel planes: a cluster (K > 1), not a fold (common practice: a fold needs a girdle).
    const planes = [{ dipDirection: 120, dip: 40 }, { dipDirection: 124, dip: 42 }, { dipDirection: 118, dip: 38 }, { dipDirection: 121, dip: 45 }, { dipDirection: 126, dip: 41 }];
    const d = describeIfGirdle(planes, analyzeFold({ planes }, { bootstrap: 0 }));
    expect(d.ok).toBe(false);
    if (!d.ok) expect(d.reason).toMatch(/^No fold description: /);
  });

  it('runAnalysisJob describes a two-limbed fold: limbs 120/40 and 240/40 meet in 180/22.76 (derived, shared check values)', () => {
    const planes = [];
    // Mirror-symmetric about 180°, so the axis trend is exactly 180 (derived).
    for (let k = 0; k < 10; k++) planes.push({ dipDirection: 120 + (k % 3) - 1, dip: 40 }, { dipDirection: 240 - (k % 3) + 1, dip: 40 });
    const r = runAnalysisJob({ id: 1, planes, lines: [], bootstrap: 50, seed: 1, density: 'kamb', net: 'equal-area' });
    expect(r.description.ok).toBe(true);
    expect(Math.abs(r.analysis.axis!.trend - 180)).toBeLessThan(1e-6);
    expect(Math.abs(r.analysis.axis!.plunge - 22.76)).toBeLessThan(0.5);
    expect(r.density!.n).toBe(planes.length);
  });
});
