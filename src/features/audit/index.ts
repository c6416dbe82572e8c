export { AuditLog, type AuditScope } from './components/audit-log.tsx';
