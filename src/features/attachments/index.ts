export { AttachmentsPanel } from './components/attachments-panel.tsx';
export { uploadAttachment, useUploadAttachment } from './api/upload-attachment.ts';
export { useAttachments } from './api/get-attachments.ts';
