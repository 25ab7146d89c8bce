/**
 * Parameter descriptors shared by several models, so that T and S mean the same thing, with the same
 * units and bounds, everywhere in the library.
 */
import type { ParameterDescriptor } from "./model.js";

/** Transmissivity T in m2/d. Bounds span very tight fractured rock to highly permeable karst and gravel. */
export const transmissivityParameter: ParameterDescriptor = {
  name: "T",
  label: "transmissivity",
  unit: "m2/d",
  positive: true,
  bounds: [1e-4, 1e6],
  description: "Rate at which water moves through a unit width of the full aquifer thickness under a unit gradient.",
};

/**
 * Storativity S, dimensionless. Bounds span confined storativity (about 1e-6 to 1e-3) up to the specific
 * yield of a water-table aquifer (up to about 0.35).
 */
export const storativityParameter: ParameterDescriptor = {
  name: "S",
  label: "storativity",
  unit: "1",
  positive: true,
  bounds: [1e-7, 0.5],
  description: "Volume of water released per unit area of aquifer per unit decline of head.",
};
