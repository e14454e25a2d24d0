/** The cautions every report ends with, in every format. */
export const REPORT_CAUTIONS: readonly string[] = [
  'Iterative convergence is one part of verification: discretisation error (a mesh and time-step study) and modelling error remain to be assessed.',
  'A converged run is not a validated one: only comparison with trustworthy measurements says whether the model represents the physics.',
  'Engineering use of these results stays under the applicable local codes and standards and licensed professional practice.',
];
