// The core scenarios (scenarios.mjs) on webkit (harness.mjs, engines/webkit.mjs).
import { coreScenarios } from './scenarios.mjs';

coreScenarios('webkit');
