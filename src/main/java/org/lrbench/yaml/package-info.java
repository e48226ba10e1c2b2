/** Reading YAML input files with the line and column of every value, collecting all problems. */
package org.lrbench.yaml;
