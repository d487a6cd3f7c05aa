// The library search forgives typos (issue 18): one edit for words of 4–7 letters, two from 8, a
// swap of neighbouring letters counting as one (Damerau's measure of spelling errors), exact and
// prefix matches ranked before near ones, and "did you mean" when a word matches nothing. Against
// the real MariaDB.
import { describe, expect, it } from 'vitest';
import { svgArt } from '../helpers/art';
import { Client, makeTeamWithRoles, useTestApp } from '../helpers/app';
import { uploadFile } from '../helpers/library';

const t = useTestApp();

const shape = (i: number) =>
  svgArt(
    120,
    120,
    `<rect x="${10 + i}" y="10" width="60" height="${40 + i}" fill="#${(0x336699 + i * 0x050505).toString(16).slice(-6)}"/>`,
  );

async function library(names: Array<[string, string?]>) {
  const { team, users } = await makeTeamWithRoles(t.db);
  const member = new Client(t.sheetsmith.app);
  await member.signIn(users.member.email);
  for (const [i, [name, keywords]] of names.entries()) {
    const res = await uploadFile(member, team.id, await shape(i), `${name}.png`, keywords ? { keywords } : {});
    expect(res.status).toBe(201);
  }
  const search = async (q: string, extra = '') => {
    const res = await member.get(`/api/teams/${team.id}/art?q=${encodeURIComponent(q)}${extra}`);
    expect(res.status).toBe(200);
    return { names: res.body.items.map((i: { name: string }) => i.name) as string[], suggestion: res.body.suggestion as string | null };
  };
  return { team, member, search };
}

describe('search that forgives typos', () => {
  it('finds "pumkin", "gohst", "lolipop", "hallowen" (the issue’s misspellings), and says what it took them for', async () => {
    const { search } = await library([['pumpkin lantern'], ['ghost'], ['lollipop', 'candy'], ['bat', 'halloween'], ['teacup']]);
    expect(await search('pumkin')).toEqual({ names: ['pumpkin lantern'], suggestion: 'pumpkin' });
    expect(await search('gohst')).toEqual({ names: ['ghost'], suggestion: 'ghost' });
    expect(await search('lolipop')).toEqual({ names: ['lollipop'], suggestion: 'lollipop' });
    expect(await search('hallowen')).toEqual({ names: ['bat'], suggestion: 'halloween' });
    expect(await search('Ghosts')).toEqual({ names: ['ghost'], suggestion: null }); // plural, case: no typo at all
    expect(await search('pumkin lanter')).toEqual({ names: ['pumpkin lantern'], suggestion: 'pumpkin lanter' }); // prefix kept
  });

  it('forgives one edit up to 7 letters and two from 8, never in words under 4', async () => {
    const { search } = await library([['lollipop'], ['halloween'], ['cat'], ['pumpkin']]);
    expect((await search('lolipo')).names).toEqual([]); // 6 letters, 2 edits from lollipop
    expect((await search('halowwen')).names).toEqual(['halloween']); // 8 letters, 2 edits
    expect((await search('cta')).names).toEqual([]); // 3 letters: no edit forgiven
    expect((await search('pmpkn')).names).toEqual([]); // 5 letters, 2 edits
  });

  // Seen in the full suite: "batch1" found batch0 and batch2 as near spellings.
  it('does not take numbered names for misspellings of each other', async () => {
    const { search } = await library([['leaf batch1'], ['leaf batch2'], ['sticker v2'], ['sticker v3']]);
    expect(await search('batch1')).toEqual({ names: ['leaf batch1'], suggestion: null });
    expect(await search('batch7')).toEqual({ names: [], suggestion: null });
    expect((await search('v3')).names).toEqual(['sticker v3']);
  });

  it('says "did you mean" when nothing matches, reaching a little further than the search', async () => {
    const { search } = await library([['cat'], ['pumpkin'], ['sunflower']]);
    expect(await search('cta')).toEqual({ names: [], suggestion: 'cat' });
    expect(await search('pmpkn')).toEqual({ names: [], suggestion: 'pumpkin' });
    expect(await search('submarine')).toEqual({ names: [], suggestion: null }); // nothing near: no guess
  });

  it('ranks exact matches, then prefixes, then near words; other sorts still apply when asked', async () => {
    const { search } = await library([['pear'], ['bearded dragon'], ['bear'], ['beard']]);
    // "bear": exact (bear), prefix (beard, bearded dragon: newest first), near (pear).
    expect((await search('bear')).names).toEqual(['bear', 'beard', 'bearded dragon', 'pear']);
    expect((await search('bear', '&sort=name&dir=asc')).names).toEqual(['bear', 'beard', 'bearded dragon', 'pear']);
    expect((await search('bear', '&sort=created&dir=asc')).names).toEqual(['pear', 'bearded dragon', 'bear', 'beard']);
  });

  it('learns new words at once: art added after a search is found by its misspelling', async () => {
    const { team, member, search } = await library([['ghost']]);
    expect((await search('gohst')).names).toEqual(['ghost']);
    expect((await search('skelton')).names).toEqual([]);
    expect((await uploadFile(member, team.id, await shape(9), 'skeleton.png')).status).toBe(201);
    expect(await search('skelton')).toEqual({ names: ['skeleton'], suggestion: 'skeleton' });
  });
});
