// Two invented clip-art packs for the demo shop, drawn here as SVG and rendered with sharp: soft
// watercolour-like edges (blur), holes, specks and separate parts, like real packs.
import sharp from 'sharp';

type DemoArt = { file: string; keywords: string[]; svg: string };

const soft = (id: string, blur: number) =>
  `<filter id="${id}" x="-20%" y="-20%" width="140%" height="140%"><feGaussianBlur stdDeviation="${blur}"/></filter>`;
const doc = (body: string, defs = '') =>
  `<svg xmlns="http://www.w3.org/2000/svg" width="900" height="900" viewBox="0 0 900 900"><defs>${soft('w', 6)}${soft('s', 14)}${defs}</defs>${body}</svg>`;

export const DEMO_PACKS: Array<{
  collection: string;
  licence: { kind: 'commercial' | 'personal'; source: string; notes: string };
  items: DemoArt[];
}> = [
  {
    collection: 'Garden Party',
    licence: { kind: 'commercial', source: 'Drawn in-house by Wren', notes: 'Our own art: sell freely.' },
    items: [
      {
        file: 'tulip-trio.png',
        keywords: ['flower', 'spring', 'tulip'],
        svg: doc(
          `<g filter="url(#w)"><path d="M300 820 C300 600 320 520 330 430" stroke="#3f7d4e" stroke-width="22" fill="none"/><path d="M450 830 C450 640 450 540 450 420" stroke="#3f7d4e" stroke-width="22" fill="none"/><path d="M600 820 C600 600 580 520 570 430" stroke="#3f7d4e" stroke-width="22" fill="none"/><path d="M250 440 Q240 300 300 280 Q330 330 360 280 Q420 300 400 440 Z" fill="#d9455f" opacity="0.9"/><path d="M390 420 Q380 260 450 240 Q480 290 510 240 Q580 260 510 420 Z" fill="#f28b82" opacity="0.9"/><path d="M520 440 Q500 300 570 280 Q600 330 630 280 Q690 300 650 440 Z" fill="#c2185b" opacity="0.9"/></g>`,
        ),
      },
      {
        file: 'sun-flower.png',
        keywords: ['flower', 'summer', 'yellow'],
        svg: doc(
          `<g filter="url(#w)">${Array.from({ length: 14 }, (_, i) => `<ellipse cx="450" cy="250" rx="48" ry="130" fill="#f4c430" opacity="0.92" transform="rotate(${(i * 360) / 14} 450 400)"/>`).join('')}<circle cx="450" cy="400" r="120" fill="#6b4226"/></g><circle cx="450" cy="400" r="38" fill="none" stroke="#3b2314" stroke-width="10"/>`,
        ),
      },
      {
        file: 'bumble-bee.png',
        keywords: ['insect', 'bee', 'summer'],
        svg: doc(
          `<g filter="url(#w)"><ellipse cx="330" cy="330" rx="120" ry="80" fill="#cfe8f3" opacity="0.8" transform="rotate(-25 330 330)"/><ellipse cx="560" cy="330" rx="120" ry="80" fill="#cfe8f3" opacity="0.8" transform="rotate(25 560 330)"/><ellipse cx="450" cy="520" rx="230" ry="160" fill="#f6c343"/><rect x="380" y="370" width="55" height="300" fill="#2b2b2b"/><rect x="500" y="375" width="55" height="290" fill="#2b2b2b"/></g><circle cx="260" cy="500" r="14" fill="#111"/><circle cx="790" cy="120" r="5" fill="#2b2b2b"/>`,
        ),
      },
      {
        file: 'lady-bugs.png',
        keywords: ['insect', 'ladybird', 'red'],
        svg: doc(
          `<g filter="url(#w)"><circle cx="300" cy="450" r="170" fill="#d62828"/><circle cx="640" cy="520" r="120" fill="#e63946"/></g><circle cx="250" cy="400" r="28" fill="#111"/><circle cx="350" cy="500" r="28" fill="#111"/><circle cx="640" cy="500" r="22" fill="#111"/>`,
        ),
      },
      {
        file: 'watering-can.png',
        keywords: ['tool', 'garden', 'water'],
        svg: doc(
          `<g filter="url(#s)"><path d="M230 380 H560 V720 Q560 760 520 760 H270 Q230 760 230 720 Z" fill="#7fb3d5"/><path d="M560 470 L780 300 L800 330 L590 540 Z" fill="#5d8aa8"/></g><path d="M300 380 Q395 200 490 380" fill="none" stroke="#5d8aa8" stroke-width="34"/>`,
        ),
      },
      {
        file: 'snail-shell.png',
        keywords: ['animal', 'snail', 'slow'],
        svg: doc(
          `<g filter="url(#w)"><path d="M150 700 Q450 650 780 700 Q800 760 700 770 H200 Q140 760 150 700 Z" fill="#b5838d"/><circle cx="470" cy="500" r="200" fill="#e5989b"/></g><circle cx="470" cy="500" r="120" fill="none" stroke="#6d597a" stroke-width="26"/><circle cx="470" cy="500" r="50" fill="none" stroke="#6d597a" stroke-width="22"/>`,
        ),
      },
    ],
  },
  {
    collection: 'Deep Space Doodles',
    licence: { kind: 'personal', source: 'Free download from a doodle blog', notes: 'Personal use only: not for stickers we sell.' },
    items: [
      {
        file: 'rocket-ship.png',
        keywords: ['rocket', 'space', 'ship'],
        svg: doc(
          `<g filter="url(#w)"><path d="M450 90 Q600 260 580 600 H320 Q300 260 450 90 Z" fill="#e9ecef"/><path d="M320 520 L210 700 L330 660 Z" fill="#e76f51"/><path d="M580 520 L690 700 L570 660 Z" fill="#e76f51"/><path d="M360 600 H540 L500 760 Q450 820 400 760 Z" fill="#f4a261" opacity="0.85"/></g><circle cx="450" cy="330" r="70" fill="#264653"/><circle cx="450" cy="330" r="42" fill="none" stroke="#e9ecef" stroke-width="8"/>`,
        ),
      },
      {
        file: 'ringed-planet.png',
        keywords: ['planet', 'space', 'saturn'],
        svg: doc(
          `<g filter="url(#w)"><circle cx="450" cy="450" r="220" fill="#9d8189"/></g><ellipse cx="450" cy="450" rx="380" ry="110" fill="none" stroke="#ffcdb2" stroke-width="36" transform="rotate(-18 450 450)"/>`,
        ),
      },
      {
        file: 'shooting-star.png',
        keywords: ['star', 'comet', 'night'],
        svg: doc(
          `<g filter="url(#s)"><path d="M120 780 L560 420 L600 470 Z" fill="#a8dadc" opacity="0.7"/></g><path d="M640 200 L690 330 L830 340 L720 420 L760 560 L640 480 L520 560 L560 420 L450 340 L590 330 Z" fill="#ffd166"/><circle cx="300" cy="300" r="7" fill="#ffd166"/><circle cx="200" cy="420" r="5" fill="#ffd166"/>`,
        ),
      },
      {
        file: 'crescent-moon.png',
        keywords: ['moon', 'night', 'space'],
        svg: doc(`<g filter="url(#w)"><path d="M520 120 A330 330 0 1 0 780 620 A260 260 0 1 1 520 120 Z" fill="#f1e3a0"/></g>`),
      },
      {
        file: 'ufo-saucer.png',
        keywords: ['ufo', 'alien', 'space'],
        svg: doc(
          `<g filter="url(#w)"><ellipse cx="450" cy="430" rx="150" ry="130" fill="#b8e0d2" opacity="0.85"/><ellipse cx="450" cy="520" rx="330" ry="95" fill="#6c757d"/></g><path d="M330 600 L250 800 M450 610 L450 820 M570 600 L650 800" stroke="#95d5b2" stroke-width="26" stroke-linecap="round"/>`,
        ),
      },
      {
        file: 'astro-helmet.png',
        keywords: ['astronaut', 'helmet', 'space'],
        svg: doc(
          `<g filter="url(#w)"><circle cx="450" cy="440" r="300" fill="#f8f9fa"/><rect x="290" y="700" width="320" height="120" rx="40" fill="#ced4da"/></g><rect x="270" y="310" width="360" height="250" rx="120" fill="#1d3557"/><path d="M330 360 Q380 330 430 350" stroke="#a8dadc" stroke-width="16" fill="none" stroke-linecap="round"/>`,
        ),
      },
    ],
  },
];

export async function renderDemoArt(art: DemoArt): Promise<Buffer> {
  return sharp(Buffer.from(art.svg)).png({ compressionLevel: 9 }).toBuffer();
}
