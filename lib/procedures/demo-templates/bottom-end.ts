import type { TemplateDocumentInput } from "../template-schema";

// Demo template. Figures are invented examples of the right order, NOT service data:
// replace them with the engine maker's and the parts makers' figures before use.
export const bottomEndTemplate: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "bottom-end-assembly",
  name: "Bottom-end assembly (inline four, forged pistons)",
  summary:
    "Measure bores and journals, check ring end gaps, fit rods and crank, close the cases. Example figures only — use the maker's service data.",
  exampleOnly: true,
  stages: [
    {
      key: "measure",
      title: "Measure before assembly",
      steps: [
        {
          key: "bore-cyl-1",
          title: "Bore gauge cylinder 1",
          instructions:
            "Zero the bore gauge on the micrometer set to nominal bore. Read at top, middle and bottom of ring travel, across the thrust axis and along the pin axis.",
          cautions: [{ kind: "general", text: "Cylinders must be clean and at room temperature before measuring." }],
          measurements: [
            {
              key: "bore-1",
              label: "Cylinder 1 bore",
              nominal: 76.0,
              min: 75.995,
              max: 76.015,
              unit: "mm",
              readingLabels: ["Top thrust", "Top pin", "Middle thrust", "Middle pin", "Bottom thrust", "Bottom pin"],
              geometry: "bore",
            },
          ],
        },
        {
          key: "piston-clearance",
          title: "Piston-to-wall clearance",
          instructions: "Measure each forged piston skirt at the maker's gauge height and subtract from the bore reading.",
          measurements: [
            { key: "ptw-1", label: "Piston-to-wall, cyl 1", nominal: 0.06, min: 0.05, max: 0.075, unit: "mm" },
            { key: "ptw-2", label: "Piston-to-wall, cyl 2", nominal: 0.06, min: 0.05, max: 0.075, unit: "mm" },
          ],
        },
        {
          key: "ring-gap",
          title: "Top ring end gap",
          instructions:
            "Square each top ring in its bore with an inverted piston and read the gap with feeler gauges. Boosted engines run a wider gap than stock.",
          cautions: [
            { kind: "boost", text: "Too small a gap on a boosted engine lets the ring ends butt when hot. Use the ring maker's figure." },
          ],
          measurements: [
            {
              key: "top-ring-gap",
              label: "Top ring gap",
              nominal: 0.4,
              min: 0.35,
              max: 0.48,
              unit: "mm",
              readingLabels: ["Cyl 1", "Cyl 2", "Cyl 3", "Cyl 4"],
            },
          ],
        },
        {
          key: "main-clearance",
          title: "Main bearing oil clearance",
          instructions: "Micrometer each main journal; bore-gauge the bearing bores with the cases torqued. Clearance = bore − journal.",
          measurements: [
            {
              key: "main-oil-clearance",
              label: "Main bearing oil clearance",
              nominal: 0.03,
              min: 0.02,
              max: 0.044,
              unit: "mm",
              readingLabels: ["Main 1", "Main 2", "Main 3", "Main 4", "Main 5"],
              geometry: "oil-clearance",
            },
          ],
        },
      ],
    },
    {
      key: "assemble",
      title: "Assemble rods and crank",
      steps: [
        {
          key: "rod-bolts",
          title: "Torque connecting-rod bolts",
          instructions:
            "Oil threads and seats with the bolt maker's lube. Tighten each rod cap in passes, then turn the angle. Check free rotation after each rod.",
          cautions: [
            {
              kind: "torque-to-yield",
              text: "Rod bolts tightened by angle stretch past yield: never reuse them. Fit new bolts every time.",
            },
          ],
          torque: [
            {
              label: "Rod cap bolts, rod 1",
              finalValue: 20,
              unit: "N·m",
              passes: [{ percent: 50 }, { percent: 100 }],
              anglePasses: [120],
              pattern: "linear",
              boltCount: 2,
              lubricant: "Assembly lube on threads and under heads",
              torqueToYield: true,
            },
          ],
        },
        {
          key: "case-sealant",
          title: "Apply case sealant and close the cases",
          instructions:
            "Thin even bead of sealant on the case face, keep it clear of oil passages, fit the upper case at once. Have the case bolts and the wrench ready before the first bead: the next step must be finished within the sealant's working time.",
          cautions: [
            { kind: "chemical", text: "Use gloves and ventilation with anaerobic sealants." },
            {
              kind: "general",
              text: "Working time: close the cases and torque every case bolt within the sealant maker's working time (example: 10 minutes from the first bead). Do not stop between this step and the last pass of the next.",
            },
          ],
        },
        {
          key: "case-bolts",
          title: "Torque crankcase bolts",
          instructions:
            "Straight after closing the cases, within the sealant's working time: tighten the main case bolts in sequence from the centre outwards in three passes. Start the cure timer when the last pass is done.",
          torque: [
            {
              label: "Main case bolts M9",
              finalValue: 32,
              unit: "N·m",
              passes: [{ percent: 30 }, { percent: 70 }, { percent: 100 }],
              anglePasses: [],
              pattern: "spiral-out",
              boltCount: 10,
              lubricant: "Engine oil on threads and washers",
            },
          ],
          timer: { label: "Sealant cure before oil and cranking", durationS: 1800, blocksStepKey: "oil-prime" },
        },
        {
          key: "oil-prime",
          title: "Fill with oil and prime the oil system",
          instructions:
            "Only once the sealant has cured: fill with the specified oil, prime the pump and turn the crank by hand. Oil pressure and crank loads on an uncured joint push the sealant out and the case leaks.",
          cautions: [{ kind: "general", text: "Do not pressurise the oil system or crank the engine before the cure time is up." }],
        },
      ],
    },
  ],
};
