export {
  kaplanMeier,
  medianSurvival,
  numbersAtRisk,
  survivalAt,
  type SurvivalItem,
  type SurvivalStep,
} from "./kaplan-meier";
