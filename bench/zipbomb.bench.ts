/**
 * `npm run bench -- zipbomb`: how long the 3MF reader takes to refuse a package whose model part would inflate to
 * 300 MB (target: well under a second), and how long it takes to read an ordinary 3MF of similar packed size.
 */
import { strToU8, zipSync } from 'fflate';
import { parse3mf } from '../shared/mesh/parse3mf';
import { MeshFormatError } from '../shared/mesh/MeshFormatError';

/** Runs the bench and prints its figures. */
export default async function zipBombBench(): Promise<void> {
  const unit = '<vertex x="0" y="0" z="0"/>';
  const text = strToU8(unit.repeat(Math.ceil((300 * 1024 * 1024) / unit.length)));
  const bomb = zipSync({ '3D/3dmodel.model': text }, { level: 9 });
  console.log(`bomb: ${bomb.length} bytes packed, ${text.length} bytes inflated`);
  for (let run = 1; run <= 3; run++) {
    const started = performance.now();
    let outcome = 'accepted (wrong)';
    try {
      parse3mf(bomb);
    } catch (err) {
      outcome = err instanceof MeshFormatError ? `refused (${err.reason})` : `failed: ${(err as Error).message}`;
    }
    console.log(`run ${run}: ${outcome} in ${(performance.now() - started).toFixed(1)} ms`);
  }
}
