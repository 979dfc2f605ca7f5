/**
 * The demo network of Keelson: Tarnwell Hydraulics, an invented mid-size maker of hydraulic
 * pumps, valves and cylinders with three plants. Every company, code and place name here is
 * invented. Built from a seeded generator so the committed workbook can be made again exactly.
 *
 * What the scenario is built to show:
 * - two dual-sourced items whose two tier-1 suppliers both buy one material from the same
 *   tier-2 supplier (hidden tier-2 single points of failure: `S-2-SHARED-A`, `S-2-SHARED-B`);
 * - one supplier cycle (two tier-2 tooling shops that supply each other);
 * - unqualified sources (alternatives still in qualification), stock cover on some items;
 * - one newly onboarded supplier nobody buys from yet (an import warning).
 */
import type {
  BomLine, Plant, Product, SourcingRow, StockRow, Supplier, SupplyModel,
} from '@keelson/contracts';

/** mulberry32: a small seeded PRNG, enough for reproducible demo data. */
function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const COUNTRIES: { country: string; region: string; weight: number }[] = [
  { country: 'DE', region: 'Europe', weight: 14 },
  { country: 'PL', region: 'Europe', weight: 9 },
  { country: 'CZ', region: 'Europe', weight: 6 },
  { country: 'IT', region: 'Europe', weight: 7 },
  { country: 'ES', region: 'Europe', weight: 5 },
  { country: 'SE', region: 'Europe', weight: 3 },
  { country: 'TR', region: 'Middle East & Africa', weight: 5 },
  { country: 'MA', region: 'Middle East & Africa', weight: 2 },
  { country: 'CN', region: 'Asia-Pacific', weight: 12 },
  { country: 'TW', region: 'Asia-Pacific', weight: 5 },
  { country: 'JP', region: 'Asia-Pacific', weight: 4 },
  { country: 'KR', region: 'Asia-Pacific', weight: 3 },
  { country: 'VN', region: 'Asia-Pacific', weight: 3 },
  { country: 'IN', region: 'Asia-Pacific', weight: 5 },
  { country: 'US', region: 'Americas', weight: 6 },
  { country: 'MX', region: 'Americas', weight: 5 },
  { country: 'BR', region: 'Americas', weight: 2 },
];

const NAME_HEADS = [
  'Brevik', 'Oltan', 'Marrow', 'Kestrel', 'Vantor', 'Halden', 'Quirin', 'Sorvel', 'Tamsin',
  'Ulvar', 'Zerand', 'Corvid', 'Pellam', 'Ferrow', 'Daskin', 'Enmore', 'Gravic', 'Istel',
  'Jorvan', 'Lusk', 'Nethra', 'Ombry', 'Ravel', 'Silvane', 'Tovar', 'Wendle', 'Yarrow',
  'Ardent', 'Belcor', 'Cindra', 'Drumlin', 'Eskar', 'Fennick', 'Galvor', 'Hesk', 'Kirran',
  'Lomond', 'Mistral', 'Norrin', 'Pyrene', 'Rostan', 'Stellan', 'Thorne', 'Umber', 'Verin',
  'Müller-Brandt', 'Nyström', 'Čermák', 'Álvarez-Roca', '蘇州精工', 'Hanabusa', 'Tiên Phong',
];
const NAME_TAILS = [
  'Castings', 'Seals', 'Precision', 'Fasteners', 'Forge', 'Polymers', 'Electronics',
  'Machining', 'Bearings', 'Springs', 'Hydraulic Parts', 'Steel', 'Coatings', 'Valves',
  'Motors', 'Sensors', 'Tooling', 'Gaskets', 'Tubes', 'Wire',
];

const PRODUCT_FAMILIES = [
  'Gear pump', 'Piston pump', 'Vane pump', 'Directional valve', 'Relief valve', 'Flow valve',
  'Tie-rod cylinder', 'Welded cylinder', 'Power unit', 'Manifold block',
];
const ASSEMBLY_NAMES = [
  'Pump housing assembly', 'Rotor group', 'Valve body assembly', 'Spool set', 'Cylinder barrel',
  'Piston rod assembly', 'Motor flange kit', 'Control block', 'Seal cartridge', 'Shaft assembly',
];
const COMPONENT_NAMES = [
  'Machined housing', 'Gear set', 'Bearing kit', 'Spool', 'Solenoid coil', 'Pressure sensor',
  'Seal kit', 'Drive shaft', 'End cap', 'Tie rod', 'Piston', 'Cartridge valve', 'Wiring harness',
];
const PART_NAMES = [
  'O-ring', 'Ball bearing', 'Hex bolt M10', 'Spring', 'Casting blank', 'Steel bar', 'PTFE ring',
  'Connector', 'Circuit board', 'Bronze bush', 'Circlip', 'Washer', 'Filter element', 'Gasket',
];
const MATERIAL_NAMES = [
  'Grey iron', 'Alloy steel billet', 'Nitrile compound', 'Copper wire', 'Aluminium ingot',
  'Bronze ingot', 'PTFE resin', 'Chrome plating service', 'Heat treatment service', 'Silicon wafer',
  'Spring steel coil', 'Die tooling', 'Powder coating', 'Stainless strip',
];

/** Sizes of the scenario. */
const SIZES = { products: 40, assemblies: 40, components: 90, madeComponents: 40, parts: 150, materials: 20 };

/** Builds the demo model. Pure and deterministic for a given seed. */
export function buildDemoNetwork(seed = 20261201): SupplyModel {
  const random = seededRandom(seed);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!;
  const between = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));
  const pickCountry = () => {
    const total = COUNTRIES.reduce((sum, c) => sum + c.weight, 0);
    let draw = random() * total;
    for (const c of COUNTRIES) {
      draw -= c.weight;
      if (draw < 0) return c;
    }
    return COUNTRIES[0]!;
  };
  const sample = <T>(list: readonly T[], count: number): T[] => {
    const copy = [...list];
    const out: T[] = [];
    while (out.length < count && copy.length > 0) out.push(copy.splice(Math.floor(random() * copy.length), 1)[0]!);
    return out;
  };
  const pad = (n: number, width = 3) => String(n).padStart(width, '0');

  const plants: Plant[] = [
    { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
    { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
    { code: 'P-EAST', name: 'Dravik Works', country: 'PL' },
  ];

  const products: Product[] = [];
  for (let i = 1; i <= SIZES.products; i++) {
    const plant = plants[(i - 1) % plants.length]!;
    const family = PRODUCT_FAMILIES[(i - 1) % PRODUCT_FAMILIES.length]!;
    products.push({
      code: `F-${pad(100 + i)}`,
      plantCode: plant.code,
      name: `${family} TH-${between(10, 99)}${String.fromCharCode(65 + (i % 6))}`,
      weeklyRevenue: between(8, 120) * 1_000 + between(0, 9) * 250,
    });
  }

  const assemblies = range(SIZES.assemblies).map((i) => ({ code: `A-${pad(i)}`, name: pick(ASSEMBLY_NAMES) }));
  const components = range(SIZES.components).map((i) => ({ code: `C-${pad(i)}`, name: pick(COMPONENT_NAMES) }));
  const madeComponents = components.slice(0, SIZES.madeComponents);
  const boughtComponents = components.slice(SIZES.madeComponents);
  const parts = range(SIZES.parts).map((i) => ({ code: `R-${pad(i)}`, name: pick(PART_NAMES) }));
  const materials = range(SIZES.materials).map((i) => ({ code: `M-${pad(i, 2)}`, name: MATERIAL_NAMES[(i - 1) % MATERIAL_NAMES.length]! }));

  const bom: BomLine[] = [];
  const addBom = (parentCode: string, childCode: string, qtyPer: number) => {
    if (!bom.some((line) => line.parentCode === parentCode && line.childCode === childCode)) {
      bom.push({ parentCode, childCode, qtyPer });
    }
  };
  // Every assembly and made component is used; products take one or two assemblies and bought parts.
  products.forEach((product, index) => {
    addBom(product.code, assemblies[index % assemblies.length]!.code, 1);
    if (random() < 0.5) addBom(product.code, pick(assemblies).code, 1);
    addBom(product.code, pick(boughtComponents).code, between(1, 4));
  });
  assemblies.forEach((assembly, index) => {
    addBom(assembly.code, madeComponents[index % madeComponents.length]!.code, 1);
    for (const component of sample(components, between(1, 3))) addBom(assembly.code, component.code, between(1, 6));
  });
  madeComponents.forEach((component, index) => {
    addBom(component.code, parts[index % parts.length]!.code, between(1, 8));
    for (const part of sample(parts, between(1, 3))) addBom(component.code, part.code, between(1, 12));
  });
  // Parts not yet used go to bought components' neighbours: give remaining parts to assemblies.
  const usedChildren = new Set(bom.map((line) => line.childCode));
  parts.filter((part) => !usedChildren.has(part.code)).forEach((part, index) => {
    addBom(madeComponents[index % madeComponents.length]!.code, part.code, between(1, 10));
  });

  // Suppliers: tier-1 sell to plants, tier-2 to tier-1, tier-3 to tier-2.
  const suppliers: Supplier[] = [];
  const usedNames = new Set<string>();
  const makeSupplier = (code: string, overrides: Partial<Supplier> = {}): Supplier => {
    let name = '';
    do name = `${pick(NAME_HEADS)} ${pick(NAME_TAILS)}`; while (usedNames.has(name));
    usedNames.add(name);
    const place = pickCountry();
    const supplier: Supplier = {
      code,
      name,
      country: place.country,
      region: place.region,
      recoveryWeeks: pick([2, 3, 4, 4, 6, 6, 8, 8, 8, 10, 12, 16, 20, 26]),
      financialHealth: between(1, 5),
      deliveryScore: between(1, 5),
      hasContinuityPlan: random() < 0.45,
      ...overrides,
    };
    suppliers.push(supplier);
    return supplier;
  };
  const tier1 = range(95).map((i) => makeSupplier(`S-1-${pad(i)}`));
  const tier2 = range(36).map((i) => makeSupplier(`S-2-${pad(i)}`));
  const tier3 = range(14).map((i) => makeSupplier(`S-3-${pad(i)}`));
  const sharedA = makeSupplier('S-2-SHARED-A', { name: 'Kestrel Forgings', country: 'CZ', region: 'Europe', recoveryWeeks: 20, hasContinuityPlan: false, financialHealth: 2 });
  const sharedB = makeSupplier('S-2-SHARED-B', { name: 'Hanabusa Sintered Metals', country: 'JP', region: 'Asia-Pacific', recoveryWeeks: 16, hasContinuityPlan: false });
  makeSupplier('S-1-NEW', { name: 'Tovar Fluid Fittings', country: 'MX', region: 'Americas' });

  const sourcing: SourcingRow[] = [];
  const sourcingKeys = new Set<string>();
  const addSource = (
    buyerCode: string, itemCode: string, supplierCode: string, sharePct: number | null, isQualified = true,
  ) => {
    const key = `${buyerCode}|${itemCode}|${supplierCode}`;
    if (sourcingKeys.has(key)) return;
    sourcingKeys.add(key);
    sourcing.push({ buyerCode, itemCode, supplierCode, sharePct, isQualified });
  };

  // What each plant buys: the leaves and bought components reached through its products' BOM.
  const children = new Map<string, string[]>();
  for (const line of bom) children.set(line.parentCode, [...(children.get(line.parentCode) ?? []), line.childCode]);
  const boughtAt = new Map<string, Set<string>>(plants.map((p) => [p.code, new Set<string>()]));
  for (const product of products) {
    const stack = [...(children.get(product.code) ?? [])];
    const seen = new Set<string>();
    while (stack.length > 0) {
      const code = stack.pop()!;
      if (seen.has(code)) continue;
      seen.add(code);
      const below = children.get(code);
      if (below) stack.push(...below);
      else boughtAt.get(product.plantCode)!.add(code);
    }
  }

  // The hidden shared tier-2 suppliers: two dual-sourced items at P-NORTH and P-SOUTH whose two
  // tier-1 sources both buy one material from the same tier-2 supplier.
  const hidden = [
    { plant: 'P-NORTH', firstSource: tier1[0]!, secondSource: tier1[1]!, material: materials[0]!, shared: sharedA },
    { plant: 'P-SOUTH', firstSource: tier1[2]!, secondSource: tier1[3]!, material: materials[1]!, shared: sharedB },
  ];
  const hiddenItems = new Map<string, (typeof hidden)[number]>();
  for (const scenario of hidden) {
    const item = [...boughtAt.get(scenario.plant)!].sort()[0]!;
    hiddenItems.set(`${scenario.plant}|${item}`, scenario);
  }

  let rotation = 4;
  for (const plant of plants) {
    for (const item of [...boughtAt.get(plant.code)!].sort()) {
      const scenario = hiddenItems.get(`${plant.code}|${item}`);
      if (scenario) {
        addSource(plant.code, item, scenario.firstSource.code, 60);
        addSource(plant.code, item, scenario.secondSource.code, 40);
        continue;
      }
      const first = tier1[rotation++ % tier1.length]!;
      if (random() < 0.8) {
        let second = pick(tier1);
        while (second === first) second = pick(tier1);
        addSource(plant.code, item, first.code, 70);
        addSource(plant.code, item, second.code, 30);
      } else {
        addSource(plant.code, item, first.code, 100);
        if (random() < 0.06) addSource(plant.code, item, pick(tier1).code, 0, false);
      }
    }
  }

  // Tier-1 suppliers buy one to three materials from tier-2 suppliers.
  for (const supplier of tier1) {
    const scenario = hidden.find((h) => h.firstSource === supplier || h.secondSource === supplier);
    if (scenario) {
      addSource(supplier.code, scenario.material.code, scenario.shared.code, 100);
      continue;
    }
    for (const material of sample(materials.slice(2), between(1, 2))) {
      const source = pick(tier2);
      const isDual = random() < 0.8;
      addSource(supplier.code, material.code, source.code, isDual ? 60 : 100);
      if (isDual) {
        let second = pick(tier2);
        while (second === source) second = pick(tier2);
        addSource(supplier.code, material.code, second.code, 40);
      }
    }
  }
  // The shared tier-2 suppliers also serve a few other tier-1 suppliers, as alternatives.
  for (const supplier of tier1.slice(10, 14)) addSource(supplier.code, materials[0]!.code, sharedA.code, 20);

  // Tier-2 suppliers buy from tier-3; two tooling shops supply each other (a supplier cycle).
  const toolingA = tier2[0]!;
  const toolingB = tier2[1]!;
  addSource(toolingA.code, 'M-12', toolingB.code, 50);
  addSource(toolingA.code, 'M-12', pick(tier3).code, 50);
  addSource(toolingB.code, 'M-12', toolingA.code, 100);
  for (const supplier of [...tier2.slice(2), sharedA, sharedB]) {
    if (random() < 0.7) {
      const material = pick(materials.slice(12));
      if (sourcing.some((row) => row.buyerCode === supplier.code && row.itemCode === material.code)) continue;
      const first = pick(tier3);
      addSource(supplier.code, material.code, first.code, 100);
      const second = pick(tier3);
      if (second !== first) addSource(supplier.code, material.code, second.code, 0, random() < 0.7);
    }
  }

  // Stock cover on about 40 % of what plants buy.
  const stock: StockRow[] = [];
  for (const plant of plants) {
    for (const item of [...boughtAt.get(plant.code)!].sort()) {
      if (random() < 0.4) stock.push({ plantCode: plant.code, itemCode: item, weeksOfCover: pick([0.5, 1, 2, 2, 3, 4, 6, 8]) });
    }
  }

  const itemNames = new Map<string, string>(
    [...assemblies, ...components, ...parts, ...materials].map((item) => [item.code, item.name]),
  );
  // Item names travel as an extra column of the BOM sheet, kept as attributes.
  for (const line of bom) line.attributes = { child_name: itemNames.get(line.childCode) ?? '' };

  return { plants, products, bom, suppliers, sourcing, stock };
}

function range(count: number): number[] {
  return Array.from({ length: count }, (_, index) => index + 1);
}
