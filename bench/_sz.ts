import { measureSize } from './scale';
void (async () => {
  for (const n of (process.argv[2] ?? '250,16000').split(',').map(Number)) {
    const x = await measureSize(n, Number(process.argv[3] ?? 40));
    console.log(JSON.stringify(x));
  }
})();
