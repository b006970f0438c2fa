import type { TemplateDocumentInput } from "../template-schema";

// Demo template. Figures are invented examples of the right order, NOT service data:
// replace them with the kit maker's, the engine maker's and the parts makers' figures before use.
export const turboKitTemplate: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "turbo-kit-intercooler",
  name: "Turbo kit and intercooler fitting",
  summary:
    "Fit the turbocharger, an external wastegate, the intercooler and the charge piping, enlarge the intake, then leak-test the charge side. Example figures only — use the kit maker's instructions and the engine maker's service data.",
  exampleOnly: true,
  stages: [
    {
      key: "plan-and-lift",
      title: "Plan the layout and get the bike up",
      steps: [
        {
          key: "lift-and-secure",
          title: "Lift and secure the bike",
          instructions:
            "Put the bike on a paddock stand and a front stand, or strap it to the lift. Drain the coolant and the oil if the kit needs the oil feed and return tapped into the sump.",
          cautions: [
            {
              kind: "lifting",
              text: "Strap the bike to the lift before removing the exhaust or the fairing: the balance point moves as parts come off.",
            },
            {
              kind: "fuel",
              text: "Disconnect the battery and cap the fuel lines before work near the fuel rail; no flames or sparks nearby.",
            },
          ],
        },
        {
          key: "route-charge-pipes",
          title: "Route the charge piping away from the exhaust",
          instructions:
            "Dry-fit the charge pipes from the compressor outlet to the intercooler and on to the throttle bodies. Keep them as far from the exhaust manifold, the turbine housing and the downpipe as the frame allows: heat from the exhaust soaks into the intake charge and costs density and detonation margin. Add heat shield or wrap where a gap cannot be had. Record the smallest gap between any charge pipe and any exhaust part.",
          cautions: [{ kind: "hot", text: "Exhaust parts stay hot long after a run: check the gaps with the engine cold." }],
          requiresPhoto: true,
          measurements: [
            {
              key: "charge-pipe-gap",
              label: "Smallest gap, charge pipe to exhaust",
              nominal: null,
              min: 50,
              max: 1000,
              unit: "mm",
              readingLabels: ["Compressor outlet", "Intercooler inlet", "Throttle-body side"],
            },
          ],
        },
      ],
    },
    {
      key: "hot-side",
      title: "Turbo and wastegate",
      steps: [
        {
          key: "mount-turbo",
          title: "Mount the turbo on the manifold",
          instructions:
            "New gasket, studs with high-temperature anti-seize, nuts tightened in a cross pattern in two passes. Turn the compressor wheel by hand: it must spin freely without touching the housing.",
          cautions: [
            { kind: "hot", text: "Manifold and turbine housing reach several hundred °C in use; route every hose and wire clear of them." },
          ],
          torque: [
            {
              label: "Turbine flange nuts M8",
              finalValue: 24,
              unit: "N·m",
              passes: [{ percent: 50 }, { percent: 100 }],
              pattern: "cross",
              boltCount: 4,
              lubricant: "High-temperature anti-seize on studs",
            },
          ],
        },
        {
          key: "oil-feed-return",
          title: "Oil feed and return",
          instructions:
            "Prime the turbo with clean engine oil through the feed port before connecting. The return line must fall all the way to the sump with no dips. Fit the restrictor if the kit supplies one.",
          cautions: [
            { kind: "general", text: "A turbo run dry for even a few seconds can lose its bearings: prime it before the first start." },
          ],
          torque: [
            {
              label: "Oil feed banjo bolt",
              finalValue: 15,
              unit: "N·m",
              passes: [],
              pattern: "linear",
              boltCount: 1,
              lubricant: "New copper washers, dry threads",
            },
          ],
        },
        {
          key: "wastegate",
          title: "Fit the external wastegate",
          instructions:
            "Mount the wastegate on the manifold take-off, fit the spring for the planned base boost, and route its vent away from the intake and from hoses. Connect the signal line from the compressor outlet.",
          cautions: [
            {
              kind: "boost",
              text: "Start on the softest spring. Boost is raised only on the dyno, with fuel and ignition checked at every step.",
            },
          ],
          torque: [
            {
              label: "Wastegate V-band clamp",
              finalValue: 9,
              unit: "N·m",
              passes: [],
              pattern: "linear",
              boltCount: 1,
              lubricant: "Anti-seize on the clamp thread",
            },
          ],
        },
      ],
    },
    {
      key: "cold-side",
      title: "Intercooler and intake",
      steps: [
        {
          key: "intercooler",
          title: "Mount the intercooler",
          instructions:
            "Mount the intercooler in clean air, on rubber isolators, with the core facing the airflow and clear of the radiator's outlet air. Clamp every joint with T-bolt clamps and check the couplers sit fully over the beads.",
          torque: [
            {
              label: "Intercooler bracket bolts M6",
              finalValue: 10,
              unit: "N·m",
              passes: [],
              pattern: "cross",
              boltCount: 4,
              lubricant: "Dry",
            },
          ],
        },
        {
          key: "larger-intake",
          title: "Fit the larger intake",
          instructions:
            "Fit the larger air filter or airbox on the intake side before the compressor. A rule of thumb (common practice, no published source) sizes that intake side, the airbox or filter housing and the inlet pipe up to the compressor, at about ten times the engine's displacement, so a 1000 cc engine wants about 10 litres; it says nothing about the charge side after the compressor. Follow the kit maker's layout where it differs. Seal the filter base fully.",
          cautions: [
            { kind: "general", text: "Unfiltered air or a loose clamp lets grit into a compressor wheel spinning at very high speed." },
          ],
        },
        {
          key: "boost-leak-test",
          title: "Leak-test the charge side",
          instructions:
            "Block the intake at the filter, pressurise the charge side with the leak tester to the planned boost plus a margin, and listen and spray every joint with soapy water. Hold the pressure for the timer and note any drop.",
          cautions: [{ kind: "boost", text: "Never pressurise past the tester's rating; stand clear of couplers while under pressure." }],
          timer: { label: "Hold leak-test pressure", durationS: 300, blocksStepKey: "sign-off-fitting" },
        },
        {
          key: "blow-off-valve",
          title: "Blow-off or bypass valve",
          instructions:
            "Fit the blow-off valve (vents to air) or bypass valve (returns to the compressor inlet) on the charge pipe close to the throttle bodies, its signal line to the manifold side of the throttle. Where the engine management meters air before the compressor, use the bypass kind so the metered air is not dumped.",
          cautions: [
            {
              kind: "boost",
              text: "Without a working valve, a throttle closed under boost sends the charge back through the compressor (surge), which hammers its bearings.",
            },
          ],
        },
        {
          key: "fuel-pressure-reference",
          title: "Fuel pressure follows boost",
          instructions:
            "Connect the fuel pressure regulator's reference port to the intake manifold (after the throttle), so fuel pressure rises with boost, about one for one (common practice). Check it: with a hand pump on the reference line, the fuel gauge must rise by the pressure applied. Photograph the gauge at rest and with pressure applied.",
          cautions: [
            {
              kind: "fuel",
              text: "A regulator referenced to air instead of the manifold leaves fuel pressure flat while boost rises: the injectors flow less than the tune expects and the engine runs lean.",
            },
          ],
          requiresPhoto: true,
        },
        {
          key: "map-sensor-range",
          title: "Manifold pressure sensor covers the boost",
          instructions:
            "Read the manifold pressure sensor's range on its data sheet. An unboosted engine's sensor often tops out near atmospheric pressure; at 10 psi of boost the manifold sits near 170 kPa absolute at sea level. Fit a sensor that reads above the highest planned boost with a margin, and set its calibration in the engine management.",
          cautions: [
            {
              kind: "fuel",
              text: "A sensor past the top of its range reads every higher boost as the same: fuelling stops following boost and the engine runs lean.",
            },
          ],
        },
        {
          key: "crankcase-breathing",
          title: "Crankcase breathing under boost",
          instructions:
            "Blow-by rises under boost. Route the crankcase breather to the intake side before the compressor or to a vented catch can, never into the pressurised charge pipe; where a breather joins a part that can be under pressure, fit a one-way valve. After the first runs, check for oil pushed out at seals, the dipstick and the breather.",
          cautions: [
            {
              kind: "general",
              text: "A pressurised crankcase pushes oil past the seals, and oil mist in the charge lowers the margin against detonation.",
            },
          ],
        },
        {
          key: "sign-off-fitting",
          title: "Check fuel and ignition before any boost",
          instructions:
            "Confirm the fuel pump, injectors and engine management can support boost before the first run under load. The first boosted runs happen on the dyno with air-fuel ratio logged.",
          cautions: [
            {
              kind: "fuel",
              text: "A lean mixture under boost melts pistons within seconds: no boost on the road before the dyno session.",
            },
            { kind: "boost", text: "Figures here are examples only; the kit maker's and engine maker's limits come first." },
          ],
        },
      ],
    },
  ],
};
