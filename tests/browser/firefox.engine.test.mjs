// The core scenarios (scenarios.mjs) on firefox (harness.mjs, engines/firefox.mjs).
import { coreScenarios } from './scenarios.mjs';

coreScenarios('firefox');
