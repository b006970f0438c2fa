import type { TemplateDocumentInput } from "../template-schema";

// Demo template. Figures are invented examples, NOT service data: replace with the maker's figures.
export const cylinderHeadTemplate: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "cylinder-head-installation",
  name: "Cylinder head installation (lowered-compression build)",
  summary:
    "Check the deck, fit the thicker head gasket, torque the head in stages with angle passes, check squish, set cam timing and check piston-to-valve clearance. Example figures only.",
  exampleOnly: true,
  stages: [
    {
      key: "head-prep",
      title: "Prepare deck and head",
      steps: [
        {
          key: "deck-height",
          title: "Piston deck clearance",
          instructions: "Dial indicator at TDC on each piston; record how far the crown sits below the deck.",
          measurements: [
            {
              key: "deck-clearance",
              label: "Deck clearance",
              nominal: 0.2,
              min: 0.1,
              max: 0.3,
              unit: "mm",
              readingLabels: ["Cyl 1", "Cyl 2", "Cyl 3", "Cyl 4"],
            },
          ],
        },
        {
          key: "head-flatness",
          title: "Head face flatness",
          instructions: "Straight edge and feeler gauges across, lengthwise and diagonally.",
          measurements: [{ key: "head-warp", label: "Head warp", nominal: 0, min: 0, max: 0.05, unit: "mm" }],
          requiresPhoto: true,
        },
      ],
    },
    {
      key: "head-fit",
      title: "Fit and torque the head",
      steps: [
        {
          key: "gasket",
          title: "Fit multi-layer head gasket",
          instructions: "Dry, clean faces. Gasket marking up. Check dowels are seated.",
          cautions: [
            { kind: "lifting", text: "The head is heavy and awkward: lift with two people or a hoist, keep fingers clear of the dowels." },
          ],
        },
        {
          key: "head-bolts",
          title: "Torque head bolts",
          instructions: "Oil threads and washers. Follow the sequence from the centre outwards for every pass, then the angle passes.",
          cautions: [{ kind: "torque-to-yield", text: "Head bolts tightened by angle are stretch bolts: fit new ones, never reuse." }],
          torque: [
            {
              label: "Head bolts M10",
              finalValue: 40,
              unit: "N·m",
              passes: [{ percent: 30 }, { percent: 70 }, { percent: 100 }],
              anglePasses: [90],
              pattern: "spiral-out",
              boltCount: 10,
              lubricant: "Engine oil on threads and washer faces",
              torqueToYield: true,
            },
          ],
        },
        {
          key: "squish",
          title: "Squish clearance",
          instructions:
            "With the head torqued, feed a length of soft solder through each plug hole towards the edge of the bore in line with the piston pin, turn the engine over TDC by hand, and measure the squashed solder's thickness with a micrometer. The thicker gasket of a lowered-compression build widens the squish: check it against the piston maker's figure.",
          cautions: [
            {
              kind: "boost",
              text: "A squish band much wider than the piston maker's figure loses its quench and can raise the risk of detonation under boost (common practice): ask before going on.",
            },
          ],
          measurements: [
            {
              key: "squish-clearance",
              label: "Squish clearance",
              nominal: 0.9,
              min: 0.7,
              max: 1.2,
              unit: "mm",
              readingLabels: ["Cyl 1", "Cyl 2", "Cyl 3", "Cyl 4"],
            },
          ],
        },
        {
          key: "cam-timing",
          title: "Set cam timing and check valve clearance",
          instructions: "Align timing marks at TDC, fit cam caps, rotate by hand twice and recheck.",
          measurements: [
            { key: "valve-clear-in", label: "Intake valve clearance", nominal: 0.15, min: 0.1, max: 0.2, unit: "mm" },
            { key: "valve-clear-ex", label: "Exhaust valve clearance", nominal: 0.25, min: 0.2, max: 0.3, unit: "mm" },
          ],
        },
        {
          key: "piston-to-valve",
          title: "Piston-to-valve clearance",
          instructions:
            "With the cams timed, put light checking springs on one intake and one exhaust valve of cylinder 1 (or modelling clay on the piston crown), turn the engine over twice by hand, and measure the closest approach of each valve to the piston. Do it again after any change to cam timing, the head's skim or the gasket.",
          cautions: [
            {
              kind: "general",
              text: "Turn the engine by hand only: if a valve touches the piston, the starter bends it before you feel it.",
            },
          ],
          measurements: [
            { key: "ptv-intake", label: "Piston-to-valve, intake", nominal: null, min: 2, max: 10, unit: "mm" },
            { key: "ptv-exhaust", label: "Piston-to-valve, exhaust", nominal: null, min: 2.5, max: 10, unit: "mm" },
          ],
        },
      ],
    },
  ],
};
