import { createEngine } from '../functions/engine.js';
const cases: any[][][] = [
 [["=SEQUENCE(1000000,2000)"]], [["=SUM(A2:BXX1000000)",1]], [["=SUM(B1:CW100000)",1]], [["=B1:B1000000*2",1]],
 [["=BXX1000000","=SUM(B:B)"]], [["=OFFSET(A1,999999,1999)","=INDEX(A:A,2000000)"]], [['=REPT("ab",200000000)']],
 [["=SEQUENCE(1000)"]], [['=SUBSTITUTE(REPT("a",30000),"a","bbbb")']], [['=SUBSTITUTE("abc","","x",2)']], [[3, 4, '=SEQUENCE(A1,B1)']], [[3000, 400, '=SEQUENCE(A1,B1)']],
 [['=MMULT(A2:A100001,B1:BXX1)']], [['=LEN(REPT("a",30000)&REPT("a",30000))', '=A1&A1']], [['=1'+'+1'.repeat(1250)]],
];
for (const c of cases) {
  const t = performance.now();
  const e = createEngine({ S: c });
  const vals = c[0].map((_, col) => { const v: any = e.getCellValue({ sheet: 0, row: 0, col }); return typeof v === 'object' && v ? `${v.value}:${v.message}` : String(v).slice(0, 30); });
  console.log(JSON.stringify(c[0]).slice(0, 70), Math.round(performance.now() - t), 'ms', Math.round(process.memoryUsage().heapUsed / 1e6), 'MB', vals);
  e.destroy();
}
