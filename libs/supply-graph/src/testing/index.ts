/**
 * `@keelson/supply-graph/testing`: seeded fixtures shared by specs, the benchmark and the demo
 * generator. Pure like the engine itself.
 */
export {
  generateTieredNetwork,
  type TieredNetworkOptions,
} from './generate-tiered-network';
export { compactModel, type CompactModel } from './compact-model';
export { mulberry32, pick, randomInt, shuffled, type Random } from './mulberry32';
export {
  WORKED_EXAMPLE,
  WORKED_EXAMPLE_EXPECTED,
  type WorkedProduct,
  type WorkedScenario,
  type WorkedSupplier,
} from './worked-example';
