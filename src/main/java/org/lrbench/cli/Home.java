package org.lrbench.cli;

import java.nio.file.Path;

/**
 * Where lrbench finds its own folders: the {@code lrbench.home} system property (set by the
 * {@code lrbench} script to the repository root), else the working directory.
 */
final class Home {

    private Home() {
    }

    static Path root() {
        String home = System.getProperty("lrbench.home");
        return Path.of(home == null || home.isBlank() ? "." : home).toAbsolutePath().normalize();
    }

    static Path drivers() {
        return root().resolve("drivers");
    }

    static Path defaultBench() {
        return root().resolve("simulator").resolve("bench.yaml");
    }

    static Path demoLot() {
        return root().resolve("simulator").resolve("demo-lot.yaml");
    }

    static String version() {
        String v = Home.class.getPackage().getImplementationVersion();
        return v == null ? "dev" : v;
    }
}
