/** The training engine's public API. Pure TypeScript: no framework, no clock, no I/O. */
export * from './errors'
export * from './units'
export {
  EQUIPMENT_KINDS,
  IWF_COLLAR_KG,
  IWF_MEN_BAR_KG,
  IWF_PLATES_KG,
  IWF_WOMEN_BAR_KG,
  KG_COMPETITION_SET,
  KG_GYM_SET,
  KG_COMPETITION_SET_15KG_BAR,
  LB_GYM_SET,
  anyLoadSchema,
  barbellSchema,
  bodyweightSchema,
  compileEquipment,
  dumbbellSchema,
  equipmentSchema,
  isLoadable,
  loadable,
  minIncrement,
  minimumLoad,
  platesPerSide,
  roundDownToLoadable,
  stackSchema,
  stepDown,
  stepUp,
  type BarbellEquipment,
  type Equipment,
  type EquipmentKind,
  type LoadOption,
  type Loadability,
} from './equipment'
export * from './plates'
export * from './e1rm'
export * from './reasons'
export * from './schemes'
export * from './warmup'
export * from './progression'
export * from './planned-sets'
export * from './find-load-ramp'
export * from './gym'
export * from './rotation'
export * from './records'
export * from './summary'
export * from './scheme-summary'
export * from './plan-checks'
export * from './plan-templates'
