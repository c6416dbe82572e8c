export { ExportMenu } from './components/export-menu.tsx';
export { exportsApi } from './api/exports-path.ts';
