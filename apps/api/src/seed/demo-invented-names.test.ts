import { createRng } from "@tagloom/tagger";
import { describe, expect, it } from "vitest";
import { buildDemoDocuments, demoEntityTypes } from "./demo-corpus";
import { DEMO_ORGANIZATION, demoUsers } from "./demo-data";
import { COMPANY_SUFFIXES, DemoNames, PLACE_FORMS, PRODUCT_WORDS } from "./demo-names";

// The demo's rule: every person, company and place in it is invented. This list of real big
// cities, countries, regions and companies is written from memory (common knowledge, not a
// gazetteer); any of them appearing as a whole word in the seed's word lists or generated texts
// fails the test. It includes short names the syllable generator could spell (Paris, Rome, Lima).
const REAL_NAMES = [
  // cities
  "London", "Leeds", "Manchester", "Liverpool", "Glasgow", "Edinburgh", "Dublin", "Cardiff", "Bristol", "Birmingham",
  "Hamburg", "Berlin", "Munich", "Cologne", "Frankfurt", "Bremen", "Rotterdam", "Amsterdam", "Antwerp", "Brussels",
  "Paris", "Lyon", "Marseille", "Rome", "Milan", "Naples", "Turin", "Genoa", "Madrid", "Barcelona", "Valencia", "Lisbon", "Porto",
  "Vienna", "Prague", "Warsaw", "Gdansk", "Budapest", "Athens", "Istanbul", "Oslo", "Bergen", "Stockholm", "Helsinki", "Copenhagen",
  "Riga", "Tallinn", "Vilnius", "Kiev", "Kyiv", "Moscow", "Odessa", "Cairo", "Lagos", "Accra", "Dakar", "Nairobi", "Durban",
  "Tokyo", "Osaka", "Kobe", "Seoul", "Busan", "Beijing", "Shanghai", "Shenzhen", "Tianjin", "Singapore", "Manila", "Jakarta",
  "Mumbai", "Delhi", "Chennai", "Karachi", "Dubai", "Doha", "Tehran", "Baghdad", "Sydney", "Melbourne", "Perth", "Auckland",
  "Toronto", "Montreal", "Vancouver", "Boston", "Chicago", "Houston", "Dallas", "Miami", "Seattle", "Denver", "Detroit",
  "Lima", "Bogota", "Santiago", "Quito", "Caracas", "Havana", "Rio", "Oporto", "Malmo", "Bilbao", "Seville", "Le Havre", "Calais",
  "Dover", "Hull", "York", "Bath", "Derby", "Aberdeen", "Dundee", "Belfast", "Cork", "Galway", "Zurich", "Geneva", "Basel",
  // countries and regions
  "England", "Scotland", "Wales", "Ireland", "France", "Germany", "Spain", "Italy", "Portugal", "Norway", "Sweden", "Finland",
  "Denmark", "Poland", "Austria", "Belgium", "Netherlands", "Holland", "Greece", "Turkey", "Russia", "Ukraine", "China", "Japan",
  "Korea", "India", "Pakistan", "Egypt", "Kenya", "Nigeria", "Ghana", "Peru", "Chile", "Brazil", "Mexico", "Canada", "Cuba",
  "Malta", "Cyprus", "Iran", "Iraq", "Oman", "Qatar", "Yemen", "Mali", "Niger", "Chad", "Togo", "Laos", "Nepal", "Texas", "Bavaria",
  // companies
  "Maersk", "Siemens", "Bosch", "Philips", "Shell", "Unilever", "Nestle", "Toyota", "Honda", "Sony", "Samsung", "Apple", "Google",
  "Amazon", "Microsoft", "Tesco", "Ikea", "Volvo", "Nokia", "Bayer", "Basf", "Boeing", "Airbus", "Ford", "Fiat", "Renault", "Lego",
];

function wholeWord(name: string): RegExp {
  return new RegExp(`(^|[^A-Za-z])${name.replace(/ /g, "\\s+")}($|[^A-Za-z])`, "i");
}

function realNamesIn(text: string): string[] {
  return REAL_NAMES.filter((n) => wholeWord(n).test(text));
}

describe("the demo's names are invented", () => {
  it("the checker itself finds the real names it lists", () => {
    expect(realNamesIn("Shipped from Hamburg to Rotterdam via Leeds.")).toEqual(["Leeds", "Hamburg", "Rotterdam"]);
    expect(realNamesIn("Londoner Freight of Hullmere")).toEqual([]);
  });

  it("no generated document, title, user, organization or entity type guideline names a real place or company", () => {
    const docs = buildDemoDocuments();
    const texts = [
      DEMO_ORGANIZATION,
      ...demoUsers.map((u) => u.name),
      ...demoEntityTypes.map((t) => JSON.stringify(t)),
      ...docs.flatMap((d) => [d.title, d.text]),
    ];
    const found = new Map<string, string>();
    for (const t of texts) for (const n of realNamesIn(t)) if (!found.has(n)) found.set(n, t.slice(0, 120));
    expect(Object.fromEntries(found)).toEqual({});
  });

  it("many names drawn from the syllable lists stay clear of the real ones", () => {
    const names = new DemoNames(createRng(2024));
    const drawn: string[] = [];
    for (let i = 0; i < 3000; i++) drawn.push(names.person(), names.company(), names.place(), names.vessel(), names.product());
    const hits = drawn.filter((n) => realNamesIn(n).length > 0);
    expect(hits).toEqual([]);
  });

  it("the seed's word lists (company suffixes, place forms, product words) hold no real name", () => {
    const words = [...COMPANY_SUFFIXES, ...PLACE_FORMS, ...PRODUCT_WORDS];
    expect(words.flatMap(realNamesIn)).toEqual([]);
  });

  it("the same seed gives the same names and documents (deterministic)", () => {
    const a = new DemoNames(createRng(5));
    const b = new DemoNames(createRng(5));
    expect(Array.from({ length: 50 }, () => a.place())).toEqual(Array.from({ length: 50 }, () => b.place()));
    expect(JSON.stringify(buildDemoDocuments())).toBe(JSON.stringify(buildDemoDocuments()));
  });
});
