/** The simulator as a library, for the gateway's tests and benchmarks. */
export { startSimulation, type Simulation, type SimulationOptions } from './simulation.js';
export {
  startBroker,
  type BrokerOptions,
  type BrokerPolicy,
  type RunningBroker,
} from './broker/broker.js';
export * from './broker/accounts.js';
export { ACL_RULES, aclPolicy, covers, mayPublish, maySubscribe } from './broker/acl.js';
export type { CommandAck, GateCommand } from './devices/commands.js';
export { ReservoirPlant, type PlantState, type Settings } from './plant/reservoir-plant.js';
export * from './scenarios/index.js';
