import { describe, expect, it } from 'vitest';
import { queryChunks, searchTerms, singular, suggestKeywords } from './search';

describe('search terms', () => {
  it('folds common English plurals to a singular', () => {
    expect(['berries', 'boxes', 'peaches', 'cats', 'glass', 'cactus', 'iris', 'sun'].map(singular)).toEqual([
      'berry',
      'box',
      'peach',
      'cat',
      'glass',
      'cactus',
      'iris',
      'sun',
    ]);
  });

  it('stores parts and joined forms of compounds, ignoring case and accents', () => {
    expect(searchTerms('Sun-Flower Crème').sort()).toEqual(['creme', 'flower', 'sun', 'sunflower'].sort());
    expect(searchTerms('rocket_ship_02')).toEqual(expect.arrayContaining(['rocket', 'ship', '02', 'rocketship02']));
  });

  it('turns a query into alternatives per chunk', () => {
    expect(queryChunks('Sun-flowers  Bees')).toEqual([
      { joined: 'sunflower', parts: ['sun', 'flower'] },
      { joined: 'bee', parts: ['bee'] },
    ]);
  });

  it('suggests keywords from folder and file names', () => {
    expect(suggestKeywords('Garden_Pack/Tulips/red-tulip-02.png')).toEqual(['garden', 'tulip', 'red']);
  });
});
