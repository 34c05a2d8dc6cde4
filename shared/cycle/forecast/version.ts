/**
 * Version of the completion forecast. Bump it whenever the model, a parameter in
 * `parameters.ts` or a sentence it writes changes, as the rule set is versioned:
 * a forecast shown to a client can then be traced to the maths that made it.
 */
export const FORECAST_VERSION = '1.1.1'
