/** Exact: 1 in = 25.4 mm, so 1 in³ = 16.387064 cm³ (NIST SP 811, appendix B). */
export const CC_PER_CUBIC_INCH = 16.387064;

/** The trade's standard tappet checking height for duration, inches. */
export const CHECKING_HEIGHT_050 = 0.05;

/** Degrees to radians. */
export const RAD_PER_DEG = Math.PI / 180;

/** Step of every sampled curve in an analysis, crank degrees. */
export const CURVE_STEP_DEG = 0.5;
