// Throughput of the streaming decode + auto-ranging path. Prints figures; not an asserted test.
import { createBurstAssembler } from '../../shared/core/bursts';
import type { CoefficientSet, CountingProbe, CountSample } from '../../shared/core/types';

const N = 1_000_000;
const probe: CountingProbe = {
  kind: 'counts', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200,
  gains: [0, 1, 2, 3].map((code) => ({ code, nominalGain: 8 ** code })),
};
const set = (id: string, from: number): CoefficientSet => ({
  id, effectiveFrom: from, dueDate: null, tRefMs: 100, alphaPerK: -0.002, tCalC: 25,
  gains: probe.gains.map((g) => ({ code: g.code, darkCounts: 40, luxPerCount: 2 / g.nominalGain, uRel: 0.015 })),
});
const sets = [set('A', 0), set('B', 3_600_000)];
const probes = { indoor: { probe, sets }, outdoor: { probe, sets } };

// Deterministic generator (LCG) so runs compare.
let seed = 12345;
const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32);

function generate(): CountSample[] {
  const out: CountSample[] = [];
  let t = 0;
  let point = 0;
  while (out.length < N) {
    const key = rnd() < 0.8 ? 'indoor' : 'outdoor';
    const lux = key === 'indoor' ? 10 ** (rnd() * 4) : 10 ** (3 + rnd() * 2.3); // outdoor often saturates
    const label = key === 'indoor' ? `P${point++}` : 'OUT';
    // Auto-ranging: start at the top gain, step down while saturated, step up is implied by the order.
    for (let g = 3; g >= 0 && out.length < N; g--) {
      const counts = Math.min(65535, Math.round(40 + lux / (2 / 8 ** g)));
      out.push({ probe: key, point: label, timeMs: t, gainCode: g, counts, intMs: 100, tempC: 20 + rnd() * 5 });
      t += 200;
      if (counts < 65000) break;
    }
    t += 11_000; // next point beyond the burst window
  }
  return out;
}

const samples = generate();
let readings = 0;
let over = 0;
function run(): number {
  const a = createBurstAssembler({ probes });
  const t0 = performance.now();
  for (let i = 0; i < samples.length; i++) {
    const r = a.push(samples[i]);
    if (r !== null) {
      readings++;
      if (r.flag === 'over_range') over++;
    }
  }
  readings += a.flush().length;
  return performance.now() - t0;
}

run(); // warm-up
const times: number[] = [];
for (let k = 0; k < 5; k++) {
  readings = 0;
  over = 0;
  times.push(run());
}
times.sort((x, y) => x - y);
const median = times[2];
console.log(`decode + burst: ${N.toLocaleString('en')} samples, ${readings.toLocaleString('en')} readings (${over.toLocaleString('en')} over range)`);
console.log(`runs (ms): ${times.map((x) => x.toFixed(1)).join(', ')}`);
console.log(`median ${median.toFixed(1)} ms = ${Math.round(N / (median / 1000)).toLocaleString('en')} samples/s (best ${Math.round(N / (times[0] / 1000)).toLocaleString('en')})`);
