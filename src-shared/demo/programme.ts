/**
 * The demo programme: an invented regional amphibian call survey. The
 * programme, its ponds, observers and numbers are fictional; the counts are
 * simulated (see truth.ts and simulate.ts).
 */
export const PROGRAMME_NAME = 'Quillbrook Basin Pond Call Survey';
/** Used in file names: `<slug>-<season>.xlsx`. */
export const PROGRAMME_SLUG = 'quillbrook-call-survey';

export const HABITATS = ['reed', 'sedge', 'open', 'wooded'] as const;
export type Habitat = (typeof HABITATS)[number];

export interface DemoPond {
  readonly name: string;
  readonly areaM2: number;
  readonly habitat: Habitat;
  /** Initials of the volunteer who usually covers the pond. */
  readonly usualObserver: string;
}

/** Volunteer initials (invented). */
export const OBSERVERS = ['RKT', 'JMW', 'AP', 'SLD', 'HB', 'CFO', 'NG', 'EVR'] as const;

const pond = (name: string, areaM2: number, habitat: Habitat, usualObserver: string): DemoPond => ({ name, areaM2, habitat, usualObserver });

/** The 40 ponds, in the order the tally sheets list them. */
export const PONDS: readonly DemoPond[] = [
  pond('Alder Carr Pond', 640, 'wooded', 'RKT'),
  pond('Bittern Reach Pool', 1600, 'reed', 'RKT'),
  pond('Cress Bank Pool', 310, 'sedge', 'RKT'),
  pond('Duckweed Hollow', 180, 'wooded', 'RKT'),
  pond('Elmstead Scrape', 920, 'open', 'RKT'),
  pond('Fernside Pond', 450, 'wooded', 'JMW'),
  pond('Gorse Corner Pool', 260, 'open', 'JMW'),
  pond('Hatchery Lane Pond', 1380, 'reed', 'JMW'),
  pond('Ivy Bridge Pool', 540, 'sedge', 'JMW'),
  pond('Juniper Flats Scrape', 1720, 'open', 'JMW'),
  pond('Kingcup Meadow Pond', 760, 'sedge', 'AP'),
  pond('Lapwing Hollow Pond', 2200, 'open', 'AP'),
  pond('Millrace Pool', 410, 'reed', 'AP'),
  pond('Nettlebed Pond', 150, 'wooded', 'AP'),
  pond('Osier Bed Pool', 1090, 'reed', 'AP'),
  pond('Peat Cutting Pond', 1700, 'sedge', 'SLD'),
  pond('Quarry Foot Pool', 830, 'open', 'SLD'),
  pond('Rushmoor Pond', 2400, 'reed', 'SLD'),
  pond('Sallow End Pond', 370, 'wooded', 'SLD'),
  pond('Teasel Field Pool', 590, 'sedge', 'SLD'),
  pond('Upper Marl Pit', 220, 'wooded', 'HB'),
  pond('Lower Marl Pit', 480, 'sedge', 'HB'),
  pond('Vetch Hill Pond', 300, 'open', 'HB'),
  pond('Willowgarth Pool', 1510, 'reed', 'HB'),
  pond('Yarrow Dip', 95, 'open', 'HB'),
  pond('Bramble Coppice Pond', 340, 'wooded', 'CFO'),
  pond('Clay Hollow Pool', 680, 'sedge', 'CFO'),
  pond('Dunlin Scrape', 1900, 'open', 'CFO'),
  pond('Eel Sluice Pond', 1240, 'reed', 'CFO'),
  pond('Flax Retting Pond', 270, 'sedge', 'CFO'),
  pond('Goosegreen Pond', 1020, 'open', 'NG'),
  pond('Heron Stand Pool', 1860, 'reed', 'NG'),
  pond('Iris Ditch Pond', 200, 'sedge', 'NG'),
  pond("Keeper's Pond", 560, 'wooded', 'NG'),
  pond('Long Acre Pool', 1450, 'sedge', 'NG'),
  pond('Moss Bank Pond', 390, 'wooded', 'EVR'),
  pond('New Scrape', 710, 'open', 'EVR'),
  pond('Orchard Pond', 130, 'wooded', 'EVR'),
  pond('Pingo Pool', 240, 'sedge', 'EVR'),
  pond('Sandpit Pond', 980, 'open', 'EVR'),
];
