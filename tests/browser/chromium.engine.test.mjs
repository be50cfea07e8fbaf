// The core scenarios (scenarios.mjs) on chromium (harness.mjs, engines/chromium.mjs).
import { coreScenarios } from './scenarios.mjs';

coreScenarios('chromium');
