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
