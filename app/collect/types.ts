// What the server page hands the phone app: plain JSON, so the offline copy of the page carries it too.
import type { UnitSystem } from "@/lib/quantity/units";

export interface PhoneHistory {
  code: string;
  observedAt: string;
  receivedAt: string;
  containers: number;
  volumeMl: number;
  tempC: number;
  waterLook: string;
  solidsLook: string;
  collector: string;
}

export interface PhoneSource {
  code: string;
  name: string;
  address: string;
  materials: string[];
  pickupEveryDays: number | null;
  collectorNote: string;
  lastPickupAt: string | null;
  /** Coordinates of the address, when known; only a distance band ever leaves the phone. */
  position: { lat: number; lon: number } | null;
  history: PhoneHistory[];
}

export interface PhoneStop {
  code: string;
  dueDay: string | null;
  daysOverdue: number;
}

export interface PhoneData {
  user: { userId: number; login: string; fullName: string; unitSystem: UnitSystem; mayRecord: boolean };
  timeZone: string;
  today: string;
  /** When the server built this page; an offline copy shows its age. */
  builtAt: string;
  sources: PhoneSource[];
  route: PhoneStop[];
  received: Array<PhoneHistory & { sourceCode: string }>;
}
