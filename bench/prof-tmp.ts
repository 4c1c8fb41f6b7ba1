import { calculateSurvey } from '../src/calc/survey.ts';
import { syntheticSurvey } from './synthetic.ts';
const survey = syntheticSurvey(10000, 10, 42);
for (let i = 0; i < 10; i++) calculateSurvey(survey);
const t0 = performance.now();
for (let i = 0; i < 20; i++) calculateSurvey(survey);
console.log('per calc ms', (performance.now() - t0) / 20);
