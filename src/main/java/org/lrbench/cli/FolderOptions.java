package org.lrbench.cli;

import java.nio.file.Path;
import picocli.CommandLine.Option;

/** The folders every command that measures or reads results shares. */
final class FolderOptions {

    private FolderOptions() {
    }

    /** {@code --calibration}: where a bench's corrections are kept, DIR/BENCH/. */
    static final class Calibration {
        @Option(names = "--calibration", paramLabel = "DIR", defaultValue = "calibration",
                description = "bench corrections from `calibrate`, kept as DIR/BENCH/ (default: ${DEFAULT-VALUE})")
        Path calibration;
    }

    /** {@code --drivers}: the folder of driver files. */
    static final class Drivers {
        @Option(names = "--drivers", paramLabel = "DIR", description = "folder of driver files (default: the installed drivers/)")
        Path drivers;

        Path folder() {
            return drivers != null ? drivers : Home.drivers();
        }
    }

    /** {@code --sampling-tables}: the lab's transcriptions of ISO 2859-1 Tables II-B and II-C. */
    static final class Tables {
        @Option(names = "--sampling-tables", paramLabel = "DIR", defaultValue = "sampling",
                description = "the lab's tightened.yaml and reduced.yaml (ISO 2859-1 Tables II-B, II-C) for the"
                        + " switching rules (default: ${DEFAULT-VALUE})")
        Path tables;
    }

    /** {@code --runs}: the result files, DIR/LOT/SERIAL.json. */
    static final class Runs {
        @Option(names = "--runs", paramLabel = "DIR", defaultValue = "runs",
                description = "folder of the result files, DIR/LOT/SERIAL.json (default: ${DEFAULT-VALUE})")
        Path runs;
    }
}
