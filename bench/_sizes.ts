import { measureSizes, tempBundles } from './startup';
const tmp = tempBundles();
measureSizes(tmp.dir).then((s) => { for (const x of s) console.log(x.name, x.kb?.toFixed(1), x.limitKb); tmp.dispose(); });
