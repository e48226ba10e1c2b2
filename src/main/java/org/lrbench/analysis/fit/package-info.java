/** Weighted nonlinear least squares and parameter covariance (Levenberg-Marquardt, Commons Math). */
package org.lrbench.analysis.fit;
