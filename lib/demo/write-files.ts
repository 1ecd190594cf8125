/** Writes the demo input files into public/demo/ (run: npm run demo:files). */
import fs from "node:fs";
import path from "node:path";
import { DEMO_FIELDS } from "./farm";
import { generateDemoFiles } from "./generate";

const outDir = path.join(process.cwd(), "public", "demo");
fs.mkdirSync(outDir, { recursive: true });
for (const spec of DEMO_FIELDS) {
  const slug = spec.name.toLowerCase().replace(/\s+/g, "-");
  const files = generateDemoFiles(spec);
  fs.writeFileSync(path.join(outDir, `${slug}-as-planted.csv`), files.plantedCsv);
  fs.writeFileSync(path.join(outDir, `${slug}-survey.csv`), files.surveyCsv);
  console.log(`${spec.name}: ${files.plantCount} as-planted records, ${files.checkpointCount} checkpoints (+6 weeds)`);
}
