/** The caution every engineering report of eigenframe carries. */
export const ENGINEERING_CAUTION =
  'Caution: these results support, and never replace, design to the local codes by a licensed engineer. ' +
  'Check the model (supports, masses, stiffness of joints and foundations) before relying on any frequency.';
