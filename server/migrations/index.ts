import { Foundation1796170000000 } from './1796170000000-Foundation.ts';
import { ResearchLog1796180000000 } from './1796180000000-ResearchLog.ts';
import { Reviews1796190000000 } from './1796190000000-Reviews.ts';
import { Files1796200000000 } from './1796200000000-Files.ts';
import { AnalysisRuns1796210000000 } from './1796210000000-AnalysisRuns.ts';
import { ReproducibilityRuns1796224000000 } from './1796224000000-ReproducibilityRuns.ts';

/** Every migration, oldest first. Register a new one with one line here. */
export const MIGRATIONS = [Foundation1796170000000, ResearchLog1796180000000, Reviews1796190000000, Files1796200000000, AnalysisRuns1796210000000, ReproducibilityRuns1796224000000];
