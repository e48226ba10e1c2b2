/** Bench files: which instruments a bench has, where they are, its safety ceiling, its simulation model. */
package org.lrbench.bench;
