import type { Rng } from "@tagloom/tagger";

// Every name in the demo is built here from syllables and word lists written for it, so that no
// person, company, place or vessel in the demo is a real one. The lists avoid syllable pairs that
// spell common place-name endings of real towns (-ton, -burg, -ville and the like), and a drawn
// word that still spells a real place or company (the syllables can make a few short ones) is
// drawn again.
const REAL_WORDS = new Set(
  (
    "turin milan paris rome lima riga oslo malta mali niger chad togo laos dakar quito porto bergen genoa seoul kobe tokyo osaka " +
    "cork bath derby hull york dover perth delhi oman iran iraq cuba peru chile doha cairo lagos accra sydney boston dallas miami " +
    "denver texas basel bremen berlin moscow madrid lisbon athens vienna prague warsaw lyon ford fiat sony shell nokia volvo bayer " +
    "lego honda tesco ikea rio kiev kyiv nepal korea india china japan kenya ghana yemen qatar leeds hamburg london bilbao malmo " +
    "zurich geneva dublin calais havana seville naples basf cyprus busan manila"
  ).split(" "),
);
const ONSETS = ["br", "d", "k", "l", "m", "n", "p", "qu", "r", "s", "t", "v", "z", "th", "g", "f", "h", "sk", "tr", "c"];
const VOWELS = ["a", "e", "i", "o", "u", "a", "e", "o", "ae", "ia", "ei"];
const CODAS = ["", "n", "r", "l", "s", "th", "m", "nd", "rk", "v", "x", "lt", "sk"];

export const COMPANY_SUFFIXES = [
  "Mills", "Ceramics", "Textiles", "Freight", "Glassworks", "Outfitters", "Paper Co", "Hardware", "Trading Ltd", "Provisions",
  "Ironworks", "Cooperage", "Dyeworks", "Joinery", "Haulage", "Rope & Sail", "Tileworks", "Orchards",
] as const;
export const PRODUCT_WORDS = ["resin", "twine", "glaze", "board", "cloth", "sealant", "pulp", "felt"] as const;
export const PLACE_FORMS = ["{} Harbour", "{} Yard", "{} Valley", "{} Crossing", "{} Quay", "Port {}", "{} Reach", "{}", "{}", "Upper {}"] as const;

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** Draws invented names, each distinct within one generator, the same for the same generator seed. */
export class DemoNames {
  private readonly used = new Set<string>();

  constructor(private readonly rng: Rng) {}

  private pick<T>(xs: readonly T[]): T {
    return xs[this.rng.nextInt(xs.length)]!;
  }

  private word(syllables: number): string {
    let w = "";
    for (let i = 0; i < syllables; i++) w += this.pick(ONSETS) + this.pick(VOWELS) + (i === syllables - 1 ? this.pick(CODAS) : "");
    return capitalise(w);
  }

  private fresh(make: () => string): string {
    for (let tries = 0; tries < 1000; tries++) {
      const name = make();
      if (!this.used.has(name) && !name.split(/[^A-Za-z]+/).some((w) => REAL_WORDS.has(w.toLowerCase()))) {
        this.used.add(name);
        return name;
      }
    }
    throw new Error("the demo name lists ran out of distinct names");
  }

  person(): string {
    return this.fresh(() => `${this.word(2)} ${this.word(2 + this.rng.nextInt(2))}`);
  }

  company(): string {
    return this.fresh(() =>
      this.rng.next() < 0.2 ? `${this.word(2)} & ${this.word(2)} Ltd` : `${this.word(2 + this.rng.nextInt(2))} ${this.pick(COMPANY_SUFFIXES)}`,
    );
  }

  place(): string {
    return this.fresh(() => this.pick(PLACE_FORMS).replace("{}", this.word(2 + this.rng.nextInt(2))));
  }

  vessel(): string {
    return this.fresh(() => `MV ${this.word(3)}`);
  }

  product(): string {
    return this.fresh(() => `${this.word(2)} ${this.pick(PRODUCT_WORDS)}`);
  }
}
