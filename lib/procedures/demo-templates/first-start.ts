import type { TemplateDocumentInput } from "../template-schema";

// Demo template. Figures are invented examples of the right order, NOT service data:
// replace them with the engine maker's and the parts makers' figures before use.
export const firstStartTemplate: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "first-start-run-in",
  name: "First start and run-in",
  summary:
    "Prime the oil system, start the rebuilt engine for the first time, bring it through heat cycles, check for leaks, retorque where the maker asks, and hand over run-in advice. Example figures only — use the engine maker's service data.",
  exampleOnly: true,
  stages: [
    {
      key: "before-start",
      title: "Before the first start",
      steps: [
        {
          key: "oil-prime",
          title: "Prime the oil system",
          instructions:
            "Fill with run-in oil to the mark. With the plugs out and the ignition and injectors disabled, crank in short bursts until the oil pressure light goes out or the gauge shows pressure.",
          cautions: [
            {
              kind: "fuel",
              text: "Injectors disabled and plug caps grounded while cranking with the plugs out: fuel vapour and open sparks do not mix.",
            },
            { kind: "general", text: "Crank in bursts and let the starter cool between them." },
          ],
          timer: { label: "Rest the starter between cranking bursts", durationS: 30, blocksStepKey: null },
        },
        {
          key: "pre-start-checks",
          title: "Pre-start checks",
          instructions:
            "Coolant filled and bled, oil at the mark, fuel lines and clamps checked, no tools or rags in the intake, fire extinguisher to hand, extraction on.",
          cautions: [
            { kind: "hot", text: "Exhaust and coolant become hot within a minute of starting: no loose clothing near the headers." },
          ],
        },
      ],
    },
    {
      key: "heat-cycles",
      title: "First start and heat cycles",
      steps: [
        {
          key: "first-start",
          title: "First start",
          instructions:
            "Start and hold a fast idle (around 2,000–2,500 rpm) rather than letting it idle slowly. Watch oil pressure and coolant temperature, listen for knocks, look for leaks and smoke. Shut down at once on any warning.",
          cautions: [{ kind: "hot", text: "Keep hands away from the exhaust and the radiator cap; never open a hot cooling system." }],
          requiresPhoto: false,
        },
        {
          key: "heat-cycle-1",
          title: "Heat cycle 1: run up to temperature, then cool",
          instructions: "Run until the fan cuts in, shut down, and let the engine cool fully before the next cycle.",
          cautions: [{ kind: "hot", text: "Let it cool fully: the timer is the least, not the most." }],
          timer: { label: "Cool down after heat cycle 1", durationS: 7200, blocksStepKey: "heat-cycle-2" },
        },
        {
          key: "heat-cycle-2",
          title: "Heat cycle 2",
          instructions: "Repeat: run to temperature with gentle blips, shut down, cool fully.",
          timer: { label: "Cool down after heat cycle 2", durationS: 7200, blocksStepKey: "leak-check" },
        },
        {
          key: "leak-check",
          title: "Leak check",
          instructions:
            "With the engine cold, check every joint: head gasket line, base gasket, oil feed and return, coolant hoses, sump plug, oil filter. Clean and recheck after a short run.",
          requiresPhoto: true,
        },
        {
          key: "recheck-after-heat",
          title: "Recheck after the heat cycles (the head is not retorqued)",
          instructions:
            "This build's head goes on with stretch (torque-to-yield) bolts and a multi-layer steel gasket (see the cylinder head job): those bolts are not retorqued. Look along the head gasket line for weeps instead. With the engine cold, bring the exhaust header nuts back to their figure, one at a time in the pattern (exhaust gaskets settle over the first heat cycles: common practice), then read the valve clearances cold.",
          cautions: [
            {
              kind: "torque-to-yield",
              text: "Never retorque a torque-to-yield head bolt. Only where a different gasket and reusable bolts were fitted and their maker asks for a retorque, follow that maker's instruction and write it in a note.",
            },
            {
              kind: "hot",
              text: "Check cold: a header nut tightened hot reads a different figure and a hot exhaust burns through gloves.",
            },
          ],
          torque: [
            {
              label: "Exhaust header nuts M8, cold recheck",
              finalValue: 20,
              unit: "N·m",
              passes: [{ percent: 100 }],
              pattern: "cross",
              boltCount: 8,
              lubricant: "As assembled (anti-seize on the studs)",
            },
          ],
          measurements: [
            {
              key: "valve-lash-in",
              label: "Valve clearance, intake, after heat cycles",
              nominal: 0.15,
              min: 0.1,
              max: 0.2,
              unit: "mm",
              readingLabels: ["Cyl 1", "Cyl 2", "Cyl 3", "Cyl 4"],
            },
          ],
        },
      ],
    },
    {
      key: "dyno-check",
      title: "Dyno check",
      steps: [
        {
          key: "dyno-cell-ready",
          title: "Make the dyno cell safe",
          instructions:
            "Roll the bike onto the dyno, wheel chocked, and strap it down with ratchet straps at both sides so it cannot move sideways or forward. Cooling fan in front of the radiator (and the intercooler on a turbo build), exhaust extraction on the tailpipe, the cell door shut, the fire extinguisher to hand. Everyone in the cell wears hearing protection.",
          cautions: [
            {
              kind: "lifting",
              text: "Tie-downs: a bike that breaks a strap under load leaves the roller. Check every strap and anchor before each session and after the first run.",
            },
            {
              kind: "general",
              text: "Nobody stands in line with the rear wheel or the roller while it turns: a thrown tread, stone or chain part leaves along that line.",
            },
            {
              kind: "hot",
              text: "Without the fan's air the engine and exhaust overheat within minutes at load; stop the run if the fan stops.",
            },
            {
              kind: "chemical",
              text: "Exhaust gas in a closed cell is poisonous: extraction on and working before the engine starts.",
            },
            {
              kind: "general",
              text: "Hearing protection for everyone in the cell: a bike at full load on a dyno is loud enough to harm hearing.",
            },
          ],
          requiresPhoto: true,
        },
        {
          key: "dyno-runs",
          title: "Runs at base boost with the mixture logged",
          instructions:
            "Warm the engine up on the dyno, then make the runs at base boost with air-fuel ratio (lambda), boost and intake temperature logged; record them on the job's dyno page with the tune they ran. Raise boost in small steps, and only while the mixture and ignition stay within the tune's limits.",
          cautions: [
            {
              kind: "fuel",
              text: "Lift off at once if the mixture goes lean under load: a lean run under boost can hole a piston within seconds.",
            },
            { kind: "boost", text: "Boost above the base spring only on the dyno, step by step, never first on the road." },
          ],
        },
      ],
    },
    {
      key: "run-in",
      title: "Run-in and handover",
      steps: [
        {
          key: "oil-change",
          title: "First oil and filter change",
          instructions:
            "Change the run-in oil and filter after the heat cycles and the dyno check; cut the filter open and look for metal.",
          cautions: [{ kind: "hot", text: "Drain warm, not hot: oil at running temperature scalds." }],
        },
        {
          key: "run-in-advice",
          title: "Give the rider the run-in advice",
          instructions:
            "Explain and hand over in writing: vary the engine speed, no long periods at one speed, no full throttle and no high revs for the first few hundred kilometres, build load gradually, no boost above base on a turbo build until the first check-up, and bring it back for the oil change and check at the agreed distance.",
          cautions: [{ kind: "general", text: "This advice is an example; the engine maker's run-in instructions come first." }],
        },
      ],
    },
  ],
};
