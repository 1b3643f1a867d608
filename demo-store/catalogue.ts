/**
 * The fictional wholesaler's range: "Larkspur Bakery Supply", a regional supplier of bakeries,
 * cafés and caterers. Every name here is invented. Lead times and shelf lives are plausible figures
 * chosen for the demo (common practice in the trade, not taken from any source).
 */
export interface DemoSupplier {
  name: string;
  leadTimeWeeks: number;
  leadTimeSdWeeks: number;
}

export const SUPPLIERS: DemoSupplier[] = [
  { name: 'Hollowbrook Mill', leadTimeWeeks: 2, leadTimeSdWeeks: 0.5 },
  { name: 'Carrowdale Grain Co.', leadTimeWeeks: 4, leadTimeSdWeeks: 1 },
  { name: 'Quillfield Cultures', leadTimeWeeks: 1, leadTimeSdWeeks: 0 },
  { name: 'Pennerby Dairy Cooperative', leadTimeWeeks: 1, leadTimeSdWeeks: 0.3 },
  { name: 'Saltmarsh Sugar & Syrup', leadTimeWeeks: 3, leadTimeSdWeeks: 0.5 },
  { name: 'Tindale Pack Works', leadTimeWeeks: 8, leadTimeSdWeeks: 2 },
];

export type Category =
  | 'flours'
  | 'grains & seeds'
  | 'yeasts & leavens'
  | 'fats'
  | 'sugars & syrups'
  | 'dairy'
  | 'fillings'
  | 'packaging';

export interface CategorySpec {
  category: Category;
  prefix: string;
  supplier: string;
  unit: string;
  /** Base names; each is offered in the pack sizes below. */
  names: string[];
  packs: string[];
  /** Typical weekly demand of one item (units). */
  level: [number, number];
  unitCost: [number, number];
  casePack: number[];
  shelfLifeWeeks: number | null;
  /** Quantities sold in fractions (kg from open sacks). */
  fractional: boolean;
}

export const CATEGORIES: CategorySpec[] = [
  {
    category: 'flours',
    prefix: 'FLR',
    supplier: 'Hollowbrook Mill',
    unit: 'sack',
    names: [
      'Strong White Bread Flour',
      'Stoneground Wholemeal Flour',
      'Light Rye Flour',
      'Dark Rye Flour',
      'Spelt Flour',
      'Pastry Flour T45',
      'Semolina Rimacinata',
      'Malted Grain Flour',
      'Self-Raising Flour',
    ],
    packs: ['25 kg', '16 kg', '5 kg'],
    level: [20, 180],
    unitCost: [9, 28],
    casePack: [1, 1, 2, 4],
    shelfLifeWeeks: null,
    fractional: false,
  },
  {
    category: 'grains & seeds',
    prefix: 'GRS',
    supplier: 'Carrowdale Grain Co.',
    unit: 'kg',
    names: [
      'Rolled Oats',
      'Pumpkin Seeds',
      'Sunflower Kernels',
      'Golden Linseed',
      'Brown Linseed',
      'Poppy Seeds',
      'Sesame Seeds',
      'Cracked Rye',
      'Kibbled Wheat',
      'Six-Seed Mix',
    ],
    packs: ['10 kg', '3 kg'],
    level: [8, 90],
    unitCost: [2, 9],
    casePack: [1, 3, 5],
    shelfLifeWeeks: null,
    fractional: true,
  },
  {
    category: 'yeasts & leavens',
    prefix: 'YST',
    supplier: 'Quillfield Cultures',
    unit: 'block',
    names: [
      'Fresh Yeast Block',
      'Instant Dry Yeast',
      'Rye Sourdough Starter',
      'Wheat Levain Culture',
      'Baking Powder',
      'Bicarbonate of Soda',
    ],
    packs: ['1 kg', '500 g', '5 kg'],
    level: [10, 120],
    unitCost: [1.5, 12],
    casePack: [10, 12, 20],
    shelfLifeWeeks: 4,
    fractional: false,
  },
  {
    category: 'fats',
    prefix: 'FAT',
    supplier: 'Pennerby Dairy Cooperative',
    unit: 'carton',
    names: [
      'Pastry Margarine Sheets',
      'Vegetable Shortening',
      'Cold-Pressed Rapeseed Oil',
      'Croissant Fat Plates',
      'Release Oil Spray',
    ],
    packs: ['10 kg', '5 kg', '2 l'],
    level: [6, 60],
    unitCost: [14, 45],
    casePack: [1, 2, 6],
    shelfLifeWeeks: 26,
    fractional: false,
  },
  {
    category: 'sugars & syrups',
    prefix: 'SUG',
    supplier: 'Saltmarsh Sugar & Syrup',
    unit: 'bag',
    names: [
      'Granulated Sugar',
      'Caster Sugar',
      'Icing Sugar',
      'Light Muscovado',
      'Demerara Sugar',
      'Golden Syrup',
      'Glucose Syrup',
      'Invert Sugar Syrup',
      'Malt Extract',
    ],
    packs: ['25 kg', '10 kg', '7 kg'],
    level: [10, 110],
    unitCost: [8, 35],
    casePack: [1, 2, 4],
    shelfLifeWeeks: null,
    fractional: false,
  },
  {
    category: 'dairy',
    prefix: 'DRY',
    supplier: 'Pennerby Dairy Cooperative',
    unit: 'case',
    names: [
      'Unsalted Butter Block',
      'Lactic Butter Sheets',
      'Whipping Cream',
      'Skimmed Milk Powder',
      'Cream Cheese Tub',
      'Liquid Egg Pasteurised',
    ],
    packs: ['10 kg', '5 l', '2 kg'],
    level: [8, 70],
    unitCost: [18, 60],
    casePack: [1, 2, 6],
    shelfLifeWeeks: 3,
    fractional: false,
  },
  {
    category: 'fillings',
    prefix: 'FIL',
    supplier: 'Saltmarsh Sugar & Syrup',
    unit: 'tub',
    names: [
      'Raspberry Bake-Stable Filling',
      'Apple & Cinnamon Filling',
      'Vanilla Custard Mix',
      'Chocolate Hazelnut Spread',
      'Lemon Curd',
      'Almond Frangipane',
      'Mincemeat',
      'Cherry Compote',
      'Salted Caramel',
    ],
    packs: ['6 kg', '3 kg'],
    level: [3, 40],
    unitCost: [12, 40],
    casePack: [1, 2, 4],
    shelfLifeWeeks: 40,
    fractional: false,
  },
  {
    category: 'packaging',
    prefix: 'PKG',
    supplier: 'Tindale Pack Works',
    unit: 'box',
    names: [
      'Kraft Bread Bags',
      'Window Cake Boxes',
      'Greaseproof Sheets',
      'Paper Baking Cases',
      'Sandwich Wedges',
      'Compostable Cups',
      'Pastry Trays',
      'Tamper Labels',
    ],
    packs: ['1000 pcs', '500 pcs', '250 pcs'],
    level: [4, 50],
    unitCost: [6, 30],
    casePack: [1, 5, 10],
    shelfLifeWeeks: null,
    fractional: false,
  },
];
