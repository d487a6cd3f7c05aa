// The scratch pool lends each buffer to one user at a time: outlines that interleave (they await
// sharp) get the same stickers as outlines made one after another.
import { describe, expect, it } from 'vitest';
import { svgArt } from '../../../tests/helpers/art';
import { outline } from './outline';
import { borrow, giveBack } from './scratch';

describe('scratch buffers', () => {
  it('lends a buffer to one borrower at a time and lends it again once given back', () => {
    const a = borrow(1000),
      b = borrow(1000);
    expect(a).not.toBe(b);
    giveBack(a);
    const c = borrow(800);
    expect(c).toBe(a); // the smallest idle buffer that is large enough
    expect(borrow(800)).not.toBe(a);
    giveBack(b, c);
  });

  it('lets go of buffers past 64 MB in all, so one huge sticker does not stay in memory', () => {
    const huge = borrow(80 * 1024 * 1024);
    giveBack(huge);
    expect(borrow(80 * 1024 * 1024)).not.toBe(huge);
  });

  it('outlines made side by side equal the same outlines made one by one, byte for byte', async () => {
    const arts = await Promise.all([
      svgArt(900, 700, '<ellipse cx="450" cy="350" rx="400" ry="300" fill="#c0392b"/>'),
      svgArt(600, 900, '<rect x="50" y="50" width="500" height="800" rx="90" fill="#2e86c1"/>'),
      svgArt(800, 800, '<circle cx="400" cy="400" r="300" fill="none" stroke="#7d3c98" stroke-width="120"/>'),
    ]);
    const sizes = ['2in', '1.5in', '2.5in'];
    const one = [];
    for (const [k, art] of arts.entries()) one.push(await outline(art, { width: sizes[k], border: '3mm' }));
    const together = await Promise.all(arts.map((art, k) => outline(art, { width: sizes[k], border: '3mm' })));
    for (let k = 0; k < arts.length; k++) {
      expect(together[k].pieces[0].png.equals(one[k].pieces[0].png), `art ${k}`).toBe(true);
      expect(together[k].pieces[0].cutLine.points).toEqual(one[k].pieces[0].cutLine.points);
    }
  });
});
