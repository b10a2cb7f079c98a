// Draws the app's install icons (web app manifest) from the SVG marks in public/: run
// `npm run icons` after changing public/favicon.svg or public/icons/icon-maskable.svg.
import path from 'node:path';
import sharp from 'sharp';

const pub = path.resolve('public');
const out = [
  { src: 'favicon.svg', file: 'icons/icon-192.png', size: 192 },
  { src: 'favicon.svg', file: 'icons/icon-512.png', size: 512 },
  { src: 'favicon.svg', file: 'icons/apple-touch-icon-180.png', size: 180 },
  // Maskable: full-bleed background, the mark inside the central safe zone (80 % circle).
  { src: 'icons/icon-maskable.svg', file: 'icons/icon-maskable-512.png', size: 512 },
];
for (const o of out) {
  await sharp(path.join(pub, o.src), { density: (72 * o.size) / 32 }).resize(o.size, o.size).png({ compressionLevel: 9 }).toFile(path.join(pub, o.file));
  console.log(`${o.file} (${o.size} px)`);
}
