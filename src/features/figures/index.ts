export { AttachFigureButton } from './components/attach-figure-button.tsx';
export { useFigures, useAttachFigure } from './api/attach-figure.ts';
