// npm run bench:search: the library search in one team of 50,000 art items (names, keywords and
// pack names made up from a clip-art word list and 8,000 made-up words), at the service (no HTTP). Prints p50 / p95 for
// the same queries spelt right (the plain prefix search, the baseline measured in the same run)
// and misspelt (typo tolerance at work), their ratio, and the cold read of the team's terms.
// Needs MariaDB (scripts/bench-search.sh starts it and a fresh bench database).
import { createHash } from 'node:crypto';
import { env } from '../../server/config/env';
import { createDataSource } from '../../server/db/data-source';
import { searchArt } from '../../server/modules/art/art-search';
import { TeamVocabularies } from '../../server/modules/art/vocabulary';
import { artListQuerySchema } from '@shared/schemas/library';
import { searchTerms } from '@shared/search';

const ITEMS = Number(process.env.BENCH_ITEMS ?? 50_000);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);
const NOUNS = `pumpkin ghost lollipop bat cat witch broom cauldron skull spider web moon star sun cloud rainbow unicorn dragon
  fox hedgehog owl bear rabbit deer squirrel mushroom acorn leaf maple oak pine tree flower tulip rose daisy sunflower lily
  lavender cactus succulent fern ivy strawberry cherry lemon orange apple pear peach watermelon avocado donut cupcake cookie
  croissant coffee teacup teapot kettle mug cake candle lantern garland wreath ornament snowflake snowman mitten scarf boot
  umbrella raindrop kite balloon gift ribbon bow heart crown diamond gem crystal feather arrow compass map anchor ship wave
  shell starfish octopus whale dolphin turtle seahorse crab lobster fish frog snail bee butterfly ladybug dragonfly moth
  camera typewriter bicycle van rocket planet comet astronaut telescope book pencil paintbrush palette scissors needle
  thread button yarn sewing quilt basket picnic blanket guitar piano violin trumpet record headphone cassette dinosaur
  robot alien monster zombie vampire mummy skeleton candy popcorn pretzel pizza taco burger fries sushi ramen dumpling`
  .split(/\s+/)
  .filter(Boolean);
const ADJECTIVES = `cute spooky cozy vintage retro pastel watercolour boho floral tiny happy sleepy grumpy magic golden
  rustic whimsical kawaii gothic festive autumn winter spring summer tropical dreamy sparkly glitter neon`
  .split(/\s+/)
  .filter(Boolean);
const PACKS = Array.from({ length: 60 }, (_, i) => `${ADJECTIVES[i % ADJECTIVES.length]} ${NOUNS[(i * 7) % NOUNS.length]} pack`);

/** A seeded random number generator (mulberry32), so every run builds the same library. */
function random(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rnd = random(7);
const pick = <T>(xs: T[]) => xs[Math.floor(rnd() * xs.length)];
// A larger vocabulary, as a real library's keywords and file names give: 8,000 made-up words.
const SYLLABLES = 'ka lo mi nu pe ra si to vu ze bri cla dro fle gro pla sna tre vel mor'.split(' ');
const MADE_UP = [...new Set(Array.from({ length: 9000 }, () => pick(SYLLABLES) + pick(SYLLABLES) + pick(SYLLABLES)))].slice(0, 8000);

const db = await createDataSource(env.DB_NAME, env).initialize();
await db.runMigrations({ transaction: 'each' });
const { insertId: userId } = await db.query("INSERT INTO users (email, name, password_hash) VALUES ('bench@search.test', 'Bench', 'x')");
const team = await db.query("INSERT INTO teams (name) VALUES ('Search bench')");
const teamId = String(team.insertId);
console.log(`building ${ITEMS} art items…`);
let t0 = performance.now();
for (let start = 0; start < ITEMS; start += 1000) {
  const rows: unknown[][] = [];
  const texts: string[][] = [];
  for (let i = start; i < Math.min(ITEMS, start + 1000); i++) {
    const name = `${pick(ADJECTIVES)} ${pick(NOUNS)}${rnd() < 0.5 ? ` ${pick(NOUNS)}` : ''} ${String(i % 100).padStart(2, '0')}`;
    const sha = createHash('sha256').update(`art-${i}`).digest('hex');
    rows.push([teamId, name, sha, sha, 'png', 100_000, 1200, 1200, 1, userId]);
    texts.push([name, pick(PACKS), pick(NOUNS), pick(ADJECTIVES), pick(NOUNS), pick(MADE_UP)]);
  }
  const res = await db.query(
    `INSERT INTO art_items (team_id, name, sha256, storage_key, format, size_bytes, width_px, height_px, has_transparency, uploaded_by) VALUES ${rows.map(() => '(?,?,?,?,?,?,?,?,?,?)').join(',')}`,
    rows.flat(),
  );
  const terms = texts.flatMap((t, k) => searchTerms(...t).map((term) => [teamId, String(Number(res.insertId) + k), term]));
  for (let i = 0; i < terms.length; i += 2000) {
    const batch = terms.slice(i, i + 2000);
    await db.query(`INSERT IGNORE INTO art_terms (team_id, art_id, term) VALUES ${batch.map(() => '(?,?,?)').join(',')}`, batch.flat());
  }
}
await db.query('ANALYZE TABLE art_items, art_terms');
const [{ n: termRows }] = await db.query('SELECT COUNT(*) AS n FROM art_terms WHERE team_id = ?', [teamId]);
console.log(`built in ${((performance.now() - t0) / 1000).toFixed(1)} s: ${termRows} term rows`);

// The same words spelt right and misspelt as makers do (a letter dropped, doubled, swapped or wrong).
const PAIRS: Array<[string, string]> = [
  ['pumpkin', 'pumkin'],
  ['ghost', 'gohst'],
  ['lollipop', 'lolipop'],
  ['festive garland', 'festve garlnd'],
  ['sunflower', 'sunflwer'],
  ['hedgehog', 'hedgehgo'],
  ['strawberry', 'strawbery'],
  ['butterfly', 'buterfly'],
  ['watercolour', 'watercolor'],
  ['mushroom', 'mushrom'],
  ['squirrel', 'squirel'],
  ['croissant', 'crossant'],
  ['cozy lantern', 'cosy lantren'],
  ['spooky skull', 'spoky skul'],
  ['dinosaur', 'dinasaur'],
  ['astronaut', 'astronot'],
  ['cactus', 'catcus'],
  ['teapot', 'teapto'],
  ['rainbow', 'rainbo'],
  ['dragonfly', 'dragonfyl'],
];
const vocabularies = new TeamVocabularies(db);
t0 = performance.now();
await vocabularies.of(teamId);
const coldMs = performance.now() - t0;

async function timeQueries(queries: string[], forgiving = true) {
  const times: number[] = [];
  let found = 0;
  for (let round = 0; round < ROUNDS + 1; round++) {
    for (const q of queries) {
      const started = performance.now();
      const page = await searchArt(db, vocabularies, teamId, artListQuerySchema.parse({ q }), forgiving);
      if (round > 0) times.push(performance.now() - started); // the first round warms the caches
      if (round === 0 && page.total > 0) found++;
    }
  }
  times.sort((a, b) => a - b);
  const pct = (p: number) => times[Math.min(times.length - 1, Math.floor(p * times.length))];
  return { p50: pct(0.5), p95: pct(0.95), found };
}
const plain = await timeQueries(
  PAIRS.map(([right]) => right),
  false,
);
const right = await timeQueries(PAIRS.map(([r]) => r));
const typos = await timeQueries(PAIRS.map(([, wrong]) => wrong));
const plainMissed = await timeQueries(
  PAIRS.map(([, wrong]) => wrong),
  false,
);
if (!process.env.BENCH_KEEP) await db.query('DELETE FROM teams WHERE id = ?', [teamId]); // BENCH_KEEP=1 leaves the library for probing
await db.destroy();

const f = (ms: number) => `${ms.toFixed(1)} ms`;
console.log(`\nsearch in one team of ${ITEMS} items (${PAIRS.length} queries × ${ROUNDS} rounds):`);
const row = (label: string, r: typeof plain) =>
  console.log(`  ${label.padEnd(44)} p50 ${f(r.p50)}  p95 ${f(r.p95)}  found ${r.found}/${PAIRS.length}`);
row('plain prefix search, spelt right (baseline)', plain);
row('plain prefix search, misspelt', plainMissed);
row('forgiving search, spelt right', right);
row('forgiving search, misspelt', typos);
console.log(`  forgiving misspelt / plain right at p95: ${(typos.p95 / plain.p95).toFixed(2)}×   target: p95 under 100 ms`);
console.log(`  cold read of the team's terms into the tree: ${f(coldMs)} (once per team, then kept)`);
