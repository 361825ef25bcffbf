import { compileMap, getCatalogueMap } from '../src/model/index.js';
import { countOrbits } from '../src/workflow/count.js';
import { checkCertificate } from '../src/checker/index.js';
const henon = compileMap(getCatalogueMap('henon')!);
const rep = await countOrbits({ map: henon, periods: [1, 2, 3, 4], region: [['-2', '2'], ['-2', '2']], level: 5, maxLevel: 8, check: false });
console.log(JSON.stringify(rep.boxGraph));
const r = checkCertificate(JSON.stringify(rep.certificate));
console.log(r.verdict, r.reason, (r as {path?: string}).path);
