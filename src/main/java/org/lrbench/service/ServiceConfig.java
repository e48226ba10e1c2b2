package org.lrbench.service;

import java.nio.file.Path;

/** Where a bench service finds its bench, drivers, plans and simulated lots, and keeps its data. */
public record ServiceConfig(Path benchFile, Path drivers, Path plans, Path simulator, Path data, Path runs,
                            Path calibration, String programVersion) {
}
