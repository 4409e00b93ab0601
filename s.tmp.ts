import simplify from "simplify-js";
import { benchSeries } from "./bench/series";
const s = benchSeries(1_000_000);
const points = Array.from(s.t, (x, i) => ({ x, y: s.v[i] }));
for (let k = 0; k < 8; k++) { const t0 = performance.now(); simplify(points, 0.65, true); console.log((performance.now() - t0).toFixed(1)); }
