// The part of convert-units 2.3.4 (CommonJS, no bundled types) that lib/units.ts uses.
declare module "convert-units" {
  interface UnitDescription {
    abbr: string;
    measure: string;
    system: string;
    singular: string;
    plural: string;
  }
  interface Converter {
    from(unit: string): Converter;
    to(unit: string): number;
    possibilities(measure?: string): string[];
    describe(unit: string): UnitDescription;
    measures(): string[];
  }
  function convert(value?: number): Converter;
  export default convert;
}
