/** Invented messages of the kinds residents type, for the benchmarks (no real data). */
export const CORPUS: string[] = [
  "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
  "sodium: 152 mEq/L\nBUN 28",
  "NA=131; GLU=38,5 mmol/L",
  "na 118, K 3.1, serum osm 250",
  "Na+ 133 / K+ 4.4 / Cl 99 / HCO3 12",
  "Na128 K3.1 glu30mmol/L",
  "plasma sodium 126 mmol/l, measured osmolality 262 mOsm/kg",
  "Glucose (mg/dL): 612  BUN: 44  Na: 149",
  "na 139 glu 6.1 mmol/l urea 5.2 mmol/l osmo 318 EtOH 230 mg/dL",
  "Na 140 glucose 5.5 mM urea 4 mM osm 302 methanol 32 mg/dL",
  "alb 2.1 g/dL na 137 cl 101 bicarb 10 glu 5 mmol/L urea 6 mmol/L osm 300",
  "bed 12 Na 121 K 3.4 glu 6.2 mmol/L urea 3.1 mmol/L osm 254",
  "glucose 30 Na 130",
  "Na 1280 K 4",
  "Mr Example MRN 1234567 Na 128 glu 6 mmol/L urea 4 mmol/L",
  "check Na 128 glu 540 mg/dL urea 14 mmol/L calc osm 810",
];
