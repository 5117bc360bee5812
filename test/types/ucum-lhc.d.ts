// The few calls the tests make into @lhncbc/ucum-lhc, which ships no types.
declare module "@lhncbc/ucum-lhc" {
  interface Conversion {
    status: "succeeded" | "failed" | "error";
    toVal: number | null;
    msg: string[];
  }
  interface Utils {
    convertUnitTo(
      from: string,
      value: number,
      to: string,
      options?: { molecularWeight?: number; charge?: number },
    ): Conversion;
    validateUnitString(unit: string): { status: "valid" | "invalid"; ucumCode: string | null };
  }
  const ucum: { UcumLhcUtils: { getInstance(): Utils } };
  export default ucum;
}
