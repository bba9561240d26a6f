/**
 * Public API of the templates layer: 3D Galactic models, line-of-sight
 * integration and the shipped ensemble.
 */
export { parseTemplateSpec, type TemplateSpec, type GasComponentSpec } from './templateSpec.js';
export { readTemplateSpec } from './readSpecFile.js';
export { buildTemplate, type BuildOptions, type BuiltTemplate } from './buildTemplate.js';
export { writeTemplate, survivalPathFor } from './writeTemplate.js';
export { loadShippedEnsemble, shippedEnsembleDir, shippedTemplateNames, buildShippedTemplate, ENSEMBLE_NSIDE, type ShippedTemplate } from './ensemble.js';
export { RADIAL_LAWS, RADIAL_LAW_NAMES, radialLaw, radialLawPeakKpc, type RadialLawName, type RadialLawParams } from './radialLaws.js';
export { dickeyLockmanCm3, hiDiscCm3, hiNakanishiSofueCm3, h2FerriereCm3, h2NakanishiSofueCm3, HI_DISC_DEFAULTS, type HiDiscParams } from './gasModels.js';
export { smoothedRadialProfile, haloVertical } from './cosmicRays.js';
export { compileExpression, type UserExpression } from './userExpression.js';
export { gaussLegendre as templateGaussLegendre, losPlan, type LosPlan } from './quadrature.js';
export { prepareIntegration, integrateToward } from './lineOfSight.js';
export { type AttenuationLengthFn } from './absorption.js';
