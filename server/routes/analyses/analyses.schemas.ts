/* The validators live in shared/schemas/analyses.ts, where the client reads them too. */
export {
  analysisRunParams,
  analysisRunQuery,
  startAnalysisBody,
  startAnalysisParams,
  type AnalysisRunParams,
  type AnalysisRunQuery,
  type StartAnalysisParams,
} from '../../../shared/schemas/analyses';
