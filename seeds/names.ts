// Fictional names for the demo plant. Built from invented word parts so that no real business,
// person, brand or place is named. The town is Quillmoor; the plant is Quillmoor Fuel Works.

export const SITE = { code: "QFW", name: "Quillmoor Fuel Works", town: "Quillmoor", timeZone: "UTC" } as const;

/** Demo accounts only: their passwords are printed at start and listed in the README. */
export const DEMO_PASSWORD = "quillmoor-demo";
export const PEOPLE = [
  { login: "collector.ivo", fullName: "Ivo Brannick", role: "COLLECTOR" },
  { login: "collector.mira", fullName: "Mira Tolvane", role: "COLLECTOR" },
  { login: "collector.odo", fullName: "Odo Fernwhistle", role: "COLLECTOR" },
  { login: "production.tess", fullName: "Tess Hollowmere", role: "PRODUCTION" },
  { login: "production.rafe", fullName: "Rafe Amberlith-Quennow", role: "PRODUCTION" },
  { login: "compliance.nell", fullName: "Nell Varrowby", role: "COMPLIANCE" },
  { login: "admin.jory", fullName: "Jory Pellinore", role: "ADMIN" },
] as const;

const FIRST = [
  "Bramble",
  "Quill",
  "Otter",
  "Fennick",
  "Lark",
  "Tumble",
  "Marrow",
  "Wick",
  "Copperleaf",
  "Thistle",
  "Moss",
  "Juniper",
  "Pebble",
  "Saffron",
  "Ember",
  "Hollow",
  "Nettle",
  "Cobble",
];
const SECOND = ["wick", "moor", "stead", "gate", "holm", "brook", "fold", "mere", "by", "ridge"];
const KIND_WORD = [
  "Kitchen",
  "Grill",
  "Noodle Bar",
  "Fry House",
  "Canteen",
  "Bistro",
  "Dumpling Room",
  "Chip Shop",
  "Diner",
  "Bakehouse",
  "Taqueria",
  "Curry House",
];
const STREETS = [
  "Wharf Row",
  "Tanner Lane",
  "Millrace Street",
  "Old Ferry Road",
  "Kiln Yard",
  "Cooper Street",
  "Lantern Walk",
  "Saltmarsh Road",
];

/** Deterministic invented restaurant names: "<First><second> <Kind>". */
export function restaurantName(i: number): string {
  const a = FIRST[i % FIRST.length] ?? "Bramble";
  const b = SECOND[(i * 7 + 3) % SECOND.length] ?? "wick";
  const k = KIND_WORD[(i * 5 + 1) % KIND_WORD.length] ?? "Kitchen";
  return `${a}${b} ${k}`;
}

export function streetAddress(i: number): string {
  return `${((i * 13) % 180) + 2} ${STREETS[i % STREETS.length] ?? "Wharf Row"}, Quillmoor`;
}

export const PROCESSORS = ["Quillmoor Crisp Works", "Fennick Snack Foods", "Larkfold Frozen Meals"];
export const RENDERERS = ["Marrowgate Rendering", "Otterholm By-Products", "Cobblestead Fats"];
export const CRUSHERS = ["Thistlemere Oilseed Mill", "Juniperbrook Crushing"];
export const OTHER_SUPPLIERS = ["Quillmoor Civic Depot"];
/** Invented customers in invented towns (codes, addresses and contacts are fiction too). */
export const CUSTOMERS = [
  {
    code: "HHC",
    name: "Harrowmere Haulage Co-op",
    address: "3 Drover's Yard, Harrowmere",
    contact: "Fuel desk, Orla Fenwright",
  },
  {
    code: "QBD",
    name: "Quillmoor Bus Depot",
    address: "Coachworks Lane, Quillmoor",
    contact: "Depot engineer, Bram Tallis",
  },
  {
    code: "TFF",
    name: "Tolvane Farm Fuels",
    address: "Upper Tolvane Barns, Bramblebrook",
    contact: "Yard office, Wenna Cobb",
  },
  {
    code: "SFC",
    name: "Saltmarsh Ferry Company",
    address: "Slipway Road, Saltmarsh End",
    contact: "Bunkering clerk, Idris Marle",
  },
] as const;
export const HAULERS = ["Brannick Liquid Waste", "Fernwhistle Environmental"];
/** Receiving facilities of the demo's hauls, by stream (fictional). */
export const DISPOSAL_FACILITIES = {
  GLYCEROL_PHASE: "Orrinford Glycerin Recovery",
  WASH_WATER: "Teasel Marsh Water Treatment",
} as const;
export const REAGENT_SUPPLIERS = {
  METHANOL: "Kilnyard Chemicals",
  KOH: "Kilnyard Chemicals",
  H2SO4: "Copperleaf Process Supplies",
  WATER: "Quillmoor Water (meter)",
} as const;
