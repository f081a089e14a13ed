/** The numeric fields the admin settings screen shows, with labels people read and the inputs' limits. */
import type { NumberField } from './NumberFields.vue';

/** The value the profile picker holds while a new printer or material is being written. */
export const NEW_PROFILE = '__new__';

/** Print settings. */
export const PRINT_SETTING_FIELDS: readonly NumberField[] = [
  { key: 'perimeters', label: 'Perimeters', min: 1, max: 20 },
  { key: 'topLayers', label: 'Top layers', min: 0, max: 50 },
  { key: 'bottomLayers', label: 'Bottom layers', min: 0, max: 50 },
  { key: 'infillPct', label: 'Infill (%)', min: 0, max: 100 },
  { key: 'supportInfillPct', label: 'Support infill (%)', min: 0, max: 100 },
  { key: 'printSpeedMmS', label: 'Print speed (mm/s)', min: 1, step: 5 },
  { key: 'flowEfficiency', label: 'Flow efficiency (0–1)', min: 0.05, max: 1, step: 0.05 },
  { key: 'travelOverheadPct', label: 'Travel overhead (%)', min: 0, max: 200 },
];

/** Cost rates (the currency and finishes are edited apart). */
export const RATE_FIELDS: readonly NumberField[] = [
  { key: 'electricityCentsPerKwh', label: 'Electricity (cents per kWh)', min: 0, cents: true },
  { key: 'labourCentsPerHour', label: 'Labour (cents per hour)', min: 0, step: 50, cents: true },
  { key: 'supportRemovalMinPerCm3', label: 'Support removal (min per cm³)', min: 0, step: 0.1 },
  { key: 'handlingMinPerUnit', label: 'Handling (min per unit)', min: 0, step: 0.5 },
  { key: 'packagingCents', label: 'Packaging (cents per unit)', min: 0, cents: true },
  { key: 'failureAllowancePct', label: 'Failed prints (%)', min: 0, max: 99 },
  { key: 'marginPct', label: 'Margin (%)', min: 0, max: 99 },
];

/** A printer profile's figures. */
export const PRINTER_FIELDS: readonly NumberField[] = [
  { key: 'nozzleMm', label: 'Nozzle (mm)', min: 0.1, step: 0.1 },
  { key: 'layerHeightMm', label: 'Layer height (mm)', min: 0.05, step: 0.05 },
  { key: 'minLayerHeightMm', label: 'Thinnest layer (mm)', min: 0.05, step: 0.05 },
  { key: 'maxLayerHeightMm', label: 'Thickest layer (mm)', min: 0.05, step: 0.05 },
  { key: 'lineWidthMm', label: 'Line width (mm)', min: 0.1, step: 0.01 },
  { key: 'maxVolumetricFlowMm3s', label: 'Highest flow (mm³/s)', min: 1 },
  { key: 'averagePowerW', label: 'Average power (W)', min: 0, step: 10 },
  { key: 'machineRateCentsPerHour', label: 'Machine rate (cents per hour)', min: 0, cents: true },
  { key: 'filamentDiameterMm', label: 'Filament diameter (mm)', min: 1, step: 0.05 },
  { key: 'layerChangeS', label: 'Layer change (s)', min: 0, step: 0.5 },
  { key: 'plateWarmUpMin', label: 'Warm-up per plate (min)', min: 0 },
];

/** A printer's build volume. */
export const BUILD_VOLUME_FIELDS: readonly NumberField[] = [
  { key: 'x', label: 'Build width (mm)', min: 1 },
  { key: 'y', label: 'Build depth (mm)', min: 1 },
  { key: 'z', label: 'Build height (mm)', min: 1 },
];

/** A material's figures. */
export const MATERIAL_FIELDS: readonly NumberField[] = [
  { key: 'densityGcm3', label: 'Density (g/cm³)', min: 0.1, step: 0.01 },
  { key: 'priceCentsPerKg', label: 'Price (cents per kg)', min: 0, step: 100, cents: true },
  { key: 'heatDeflectionC', label: 'Heat deflection (°C)', step: 1 },
  { key: 'glassTransitionC', label: 'Glass transition (°C)', step: 1 },
  { key: 'thermalConductivityWmK', label: 'Thermal conductivity (W/m·K)', min: 0.01, step: 0.01 },
];

/** Packaging rules of the sales settings. */
export const PACKAGING_FIELDS: readonly NumberField[] = [
  { key: 'paddingMm', label: 'Padding (mm)', min: 0, max: 200 },
  { key: 'boxStepMm', label: 'Box size step (mm)', min: 1, max: 100 },
  { key: 'boardThicknessMm', label: 'Board thickness (mm)', min: 0, max: 20, step: 0.5 },
  { key: 'boardGsm', label: 'Board grammage (g/m²)', min: 0, max: 5000, step: 10 },
  { key: 'fillMassG', label: 'Fill and tape (g)', min: 0, max: 5000 },
];

/** Farm figures of the sales settings (copies per plate is left to the plate fit). */
export const FARM_FIELDS: readonly NumberField[] = [
  { key: 'printers', label: 'Printers in the farm', min: 1, max: 10000 },
  { key: 'hoursPerDay', label: 'Machine hours per day', min: 1, max: 24 },
  { key: 'failureRatePct', label: 'Failed prints (%)', min: 0, max: 99 },
  { key: 'plateChangeMin', label: 'Plate change (min)', min: 0, max: 600 },
  { key: 'handlingDays', label: 'Packing and dispatch (days)', min: 0, max: 60 },
];
