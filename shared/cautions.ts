/** The cautions Lobewright shows wherever a prediction is close to a limit or goes to an owner. */
export const productCautions = {
  measure:
    'Predictions do not replace measurement. Check piston-to-valve clearance and coil bind on the engine, with checking springs or clay, before the engine turns over under power.',
  manual: "Follow the engine maker's service manual for torque specs and for parts that must not be reused.",
  emissions: 'A non-stock cam profile can break emissions rules for road vehicles in some places. Check local rules before fitting one.',
  practice: 'Defer to local codes and licensed practice.',
} as const;

export const allCautions: readonly string[] = Object.values(productCautions);
