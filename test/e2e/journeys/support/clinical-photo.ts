import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';

/** A generated stand-in for a clinical photograph, written to a temporary file. */
export interface GeneratedPhoto {
  readonly path: string;
  readonly bytes: number;
}

/**
 * Draws a schematic upper front view (gingiva over six crowns, on a cheek-retractor background)
 * and adds fine grain, as a camera's sensor would. The grain keeps JPEG from squeezing the file
 * small, so a throttled upload takes long enough to watch its progress. Invented; no patient.
 */
export async function generateClinicalPhoto(width = 1600, height = 1200): Promise<GeneratedPhoto> {
  const crowns = Array.from({ length: 6 }, (_, index) => {
    const crownWidth = [150, 170, 210, 210, 170, 150][index] ?? 170;
    const x = 270 + [0, 155, 330, 545, 760, 935][index];
    return `<rect x="${x}" y="520" width="${crownWidth}" height="${index === 2 || index === 3 ? 360 : 320}" rx="40" fill="#f4efe4" stroke="#d9d0bf" stroke-width="6"/>`;
  }).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 1600 1200">
    <rect width="1600" height="1200" fill="#3b2a2a"/>
    <ellipse cx="800" cy="640" rx="760" ry="420" fill="#7a3b3f"/>
    <path d="M180 430 Q800 300 1420 430 L1420 600 Q800 520 180 600 Z" fill="#d9868b"/>
    ${crowns}
    <path d="M240 560 Q320 470 400 560 Q480 470 560 560 Q660 460 760 560 Q860 460 960 560 Q1060 470 1140 560 Q1220 470 1300 560" fill="none" stroke="#c26a70" stroke-width="14"/>
    <text x="60" y="1150" font-family="sans-serif" font-size="40" fill="#f0e6d8">Generated test image · not a patient</text>
  </svg>`;
  const { data, info } = await sharp(Buffer.from(svg)).resize(width, height).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  // Deterministic grain (a linear congruential generator, Numerical Recipes' constants), ±20 per channel.
  let seed = 20_261_202;
  for (let index = 0; index < data.length; index++) {
    seed = (Math.imul(seed, 1_664_525) + 1_013_904_223) >>> 0;
    data[index] = Math.max(0, Math.min(255, data[index] + ((seed >>> 24) % 41) - 20));
  }
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'tidemark-photo-')), 'upper-front-recall.jpg');
  const written = await sharp(data, { raw: { width: info.width, height: info.height, channels: info.channels } }).jpeg({ quality: 92 }).toFile(file);
  return { path: file, bytes: written.size };
}
