export { MeasurementsPanel } from './components/measurements-panel.tsx';
export { measurementLayers, withMeasurements } from './components/measurement-overlay.ts';
export { useMeasurements } from './api/measurements.ts';
