/** Uncertainty budgets after JCGM 100:2008 (GUM): distributions, sensitivities, combination. */
package org.lrbench.uncertainty;
