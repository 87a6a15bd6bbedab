/**
 * The facility's time zone for luxon, with each hour's UTC offset remembered. luxon asks the
 * platform's time-zone data (Intl.DateTimeFormat#formatToParts) for the offset every time a
 * DateTime is made, moved or started at a day — about twenty times for one booking's rules, its
 * series and its mail, and a fifth of a booking's whole cost. Offsets only change at the zone's
 * transitions, so the offset of a whole hour is kept once its first and last second agree (an
 * hour holding a transition is never kept: each instant in it is asked afresh). The answers are
 * exactly luxon's own (tests/unit/zones.test.ts compares them across DST changes).
 */
import { IANAZone, Info, Zone, type ZoneOffsetOptions, type ZoneOffsetFormat } from "luxon";

const HOUR_MS = 3_600_000;
/** Hours kept per zone before the memory starts afresh (about eleven years of hours). */
const KEEP_HOURS = 100_000;

export class RememberedZone extends Zone {
  private readonly iana: IANAZone;
  private readonly hours = new Map<number, number>();

  constructor(name: string) {
    super();
    this.iana = IANAZone.create(name);
  }

  get type(): string {
    return "iana";
  }
  get name(): string {
    return this.iana.name;
  }
  get ianaName(): string {
    return this.iana.name;
  }
  get isUniversal(): boolean {
    return false;
  }
  get isValid(): boolean {
    return this.iana.isValid;
  }
  offsetName(ts: number, opts: ZoneOffsetOptions): string | null {
    return this.iana.offsetName(ts, opts);
  }
  formatOffset(ts: number, format: ZoneOffsetFormat): string {
    return this.iana.formatOffset(ts, format);
  }
  equals(other: Zone): boolean {
    return other.type === "iana" && other.name === this.name;
  }

  offset(ts: number): number {
    const hour = Math.floor(ts / HOUR_MS);
    const known = this.hours.get(hour);
    if (known !== undefined) return known;
    const first = this.iana.offset(hour * HOUR_MS);
    if (Number.isNaN(first) || this.iana.offset(hour * HOUR_MS + HOUR_MS - 1000) !== first) return this.iana.offset(ts);
    if (this.hours.size >= KEEP_HOURS) this.hours.clear();
    this.hours.set(hour, first);
    return first;
  }
}

const zones = new Map<string, Zone>();

/**
 * The zone to give luxon for a zone name (`{ zone: facilityZone(tz) }`): an IANA name gets the
 * remembered zone; anything else ("UTC+3", an unknown name) is what luxon itself makes of it.
 */
export function facilityZone(name: string): Zone {
  let zone = zones.get(name);
  if (!zone) {
    zone = IANAZone.isValidZone(name) ? new RememberedZone(name) : Info.normalizeZone(name);
    zones.set(name, zone);
  }
  return zone;
}
