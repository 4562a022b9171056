/** The model: its JSON format, validation, DOF numbering, assembly and mechanism checks. */
export type {
  Space, DofName, ElementKind, MassKind, MaterialSpec, SectionSpec, NodeSpec, ElementSpec,
  SupportSpec, SpringSpec, MassSpec, Model, DofInfo, AssembledModel,
} from './types';
export { parseModel, validateModel, MODEL_FORMAT, ELEMENT_KINDS, COINCIDENCE_TOLERANCE, MODEL_LIMITS } from './read';
export { numberDofs, DOF_NAMES, DOF_SLOT, SPACE_DOFS, type DofNumbering } from './dofs';
export { assemble } from './assemble';
export { findMechanisms, assertNoMechanism, MECHANISM_DEFAULTS, type Mechanism, type MechanismOptions } from './mechanisms';
export { assembleGeometric } from './geometric';
export { nodalLoadVector, type NodalLoad, type LoadCase } from './loads';
export { elementMatrices, fillElementMatrices, type ElementMatrices, type FrameProps } from './element-matrices';
