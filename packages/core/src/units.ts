/**
 * Unit conversions for US customary users. Exact definitions: 1 US gallon = 3.785411784 L,
 * 1 quart = ¼ gallon, 1 US fluid ounce = 1/128 gallon; 1 avoirdupois pound = 453.59237 g,
 * 1 ounce = 1/16 lb [CP] (international yard and pound agreement, 1959).
 */
export { platoFromSg, sgFromPlato } from './gravity.js';

export const LITRES_PER_US_GALLON = 3.785411784;
export const LITRES_PER_US_QUART = LITRES_PER_US_GALLON / 4;
export const LITRES_PER_US_FL_OZ = LITRES_PER_US_GALLON / 128;
export const GRAMS_PER_POUND = 453.59237;
export const GRAMS_PER_OUNCE = GRAMS_PER_POUND / 16;

export const litresFromUsGallons = (gal: number): number => gal * LITRES_PER_US_GALLON;
export const usGallonsFromLitres = (litres: number): number => litres / LITRES_PER_US_GALLON;
export const litresFromUsQuarts = (qt: number): number => qt * LITRES_PER_US_QUART;
export const usQuartsFromLitres = (litres: number): number => litres / LITRES_PER_US_QUART;
export const litresFromUsFlOz = (flOz: number): number => flOz * LITRES_PER_US_FL_OZ;
export const usFlOzFromLitres = (litres: number): number => litres / LITRES_PER_US_FL_OZ;
export const millilitresFromLitres = (litres: number): number => litres * 1000;
export const litresFromMillilitres = (ml: number): number => ml / 1000;

export const gramsFromOunces = (oz: number): number => oz * GRAMS_PER_OUNCE;
export const ouncesFromGrams = (g: number): number => g / GRAMS_PER_OUNCE;
export const gramsFromPounds = (lb: number): number => lb * GRAMS_PER_POUND;
export const poundsFromGrams = (g: number): number => g / GRAMS_PER_POUND;

export const fahrenheitFromCelsius = (tempC: number): number => (tempC * 9) / 5 + 32;
export const celsiusFromFahrenheit = (tempF: number): number => ((tempF - 32) * 5) / 9;
