// The demo scenario: an invented residential development and its invented team. Nothing here is a real
// person, firm or site. Imported by the seed and by `npm start` to print the sign-ins.
import type { Role } from "../app/projects/permissions";

export const DEMO_PASSWORD = "countersign-demo";

export interface DemoPerson {
  email: string;
  name: string;
  role: Role;
  profession: string;
  phone?: string;
  registrationNumber?: string;
  registrationBody?: string;
}

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: "manager@kestrel-rise.example", name: "Marisa Okonkwo-Venter", role: "manager", profession: "manager", phone: "+27 21 555 0101" },
  { email: "architect@ridgeline-studio.example", name: "Tebogo Lindqvist", role: "architect", profession: "architect", phone: "+27 21 555 0102" },
  {
    email: "engineer@stillwater-consult.example",
    name: "Anneliese Mabuza",
    role: "engineer",
    profession: "engineer",
    phone: "+27 21 555 0103",
    registrationNumber: "DEMO-20261234",
    registrationBody: "Demo engineering registration board",
  },
  { email: "plumber@trueflow-plumbing.example", name: "Sipho van der Berg", role: "site_plumber", profession: "plumber", phone: "+27 82 555 0104" },
];

export const DEMO_PROJECT = {
  name: "Kestrel Rise Townhouses",
  siteAddress: "Erf 4417, 9 Weaver Bird Close, Kestrel Rise (demo site)",
  clientName: "Kestrel Rise Body Corporate (demo)",
  description:
    "Six double-storey townhouses, each with a 150 L electric storage water heater in the roof space. Units 5 and 6 have flat concrete roofs, so discharge pipe routing and vacuum breaker positions need attention.",
};

/** Invented deviation requests on the demo project: one with the engineer, one still a draft. */
export const DEMO_REQUESTS = [
  {
    state: "in_review" as const,
    title: "Unit 5: discharge pipe run too long on the flat roof",
    provision: "discharge" as const,
    clauseRef: "Discharge pipe length and size (demo reference)",
    siteConstraint:
      "Unit 5 has a flat concrete roof with a 600 mm parapet. The nearest place where the discharge can end visibly and harmlessly is the gutter outlet on the far side, 7.5 m from the relief valve.",
    proposal:
      "Enlarge the discharge pipe from 22 mm to 28 mm at the valve outlet and run it 7.5 m along the inside of the parapet to the gutter outlet, with two 45° bends and no elbows, fixed every 1.2 m.",
    measurements: [
      { kind: "lengthM", name: "Discharge run to gutter outlet", value: 7.5, unit: "m" },
      { kind: "pipeSizeMm", name: "Relief valve connection", value: 22, unit: "mm" },
      { kind: "bendCount", name: "Bends", value: 2, unit: "bends" },
      { kind: "staticPressureKpa", name: "Static pressure at the meter", value: 520, unit: "kPa" },
    ],
  },
  {
    state: "draft" as const,
    title: "Unit 6: no room for a vacuum breaker riser",
    provision: "vacuum_breakers" as const,
    clauseRef: "",
    siteConstraint: "The heater in unit 6 sits under a low slab; there is 180 mm above the hot outlet.",
    proposal: "",
    measurements: [{ kind: "distanceMm", name: "Clearance above the hot outlet", value: 180, unit: "mm" }],
  },
];
