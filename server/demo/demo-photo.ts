import sharp from 'sharp';

/**
 * A generated, obviously schematic "clinical photograph" for the demo: ivory crowns and a
 * scalloped pink gingival margin, lower before surgery and higher after. No real patient.
 */
export async function demoPhotograph(kind: 'pre-operative' | 'post-operative', variant: number): Promise<Buffer> {
  const width = 640;
  const height = 400;
  const margin = kind === 'pre-operative' ? 215 : 175;
  const teeth = [80, 170, 260, 350, 440, 530];
  const crowns = teeth
    .map((x, index) => `<rect x="${x}" y="90" width="${index === 2 || index === 3 ? 86 : 78}" height="230" rx="26" fill="#f4ede0" stroke="#d8cbb3" stroke-width="3"/>`)
    .join('');
  const scallops = teeth.map((x) => `Q ${x + 40} ${margin - 42 - (variant % 3) * 4} ${x + 86} ${margin}`).join(' ');
  const gingiva = `<path d="M 40 ${margin} ${scallops} L 620 ${margin} L 620 400 L 40 400 Z" fill="#d9777f" stroke="#b9555e" stroke-width="3"/>`;
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><rect width="100%" height="100%" fill="#3b2f33"/>${crowns}${gingiva}<rect x="12" y="12" width="60" height="20" rx="4" fill="#2f7f7a"/></svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 85 }).toBuffer();
}
