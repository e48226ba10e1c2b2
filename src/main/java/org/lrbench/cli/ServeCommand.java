package org.lrbench.cli;

import java.io.IOException;
import java.net.InetAddress;
import java.net.UnknownHostException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.security.SecureRandom;
import java.util.HexFormat;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.lrbench.service.BenchService;
import org.lrbench.service.HttpApi;
import org.lrbench.service.ServiceConfig;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code lrbench serve}: the bench service with its HTTP API and operator page. */
@Command(name = "serve", mixinStandardHelpOptions = true, description = {"Run the bench service: HTTP API and operator page for one bench, until Ctrl-C.",
        "Listens on 127.0.0.1 unless --listen says otherwise; then every call needs the access token."})
final class ServeCommand implements Callable<Integer> {

    @Mixin
    StoreLocation location;

    @Mixin
    BenchOptions benchOptions;

    @Mixin
    FolderOptions.Calibration calibrationOption;

    @Mixin
    FolderOptions.Runs runsOption;

    @Mixin
    FolderOptions.Tables tablesOption;

    @Option(names = "--port", paramLabel = "N", defaultValue = "8750", description = "port (default: ${DEFAULT-VALUE}; 0 picks one)")
    int port;

    @Option(names = "--listen", paramLabel = "ADDR", defaultValue = "127.0.0.1",
            description = "address to listen on (default: ${DEFAULT-VALUE})")
    String listen;

    @picocli.CommandLine.Mixin
    LogOptions logging;

    @Override
    public Integer call() throws Exception {
        logging.apply();
        if (port < 0 || port > 65535) {
            throw new BadInputException("--port " + port + ": use 0 to 65535");
        }
        InetAddress address;
        try {
            address = InetAddress.getByName(listen);
        } catch (UnknownHostException e) {
            throw new BadInputException("--listen '" + listen + "': not an address of this machine");
        }
        String token = address.isLoopbackAddress() ? null : token(location.data);
        ServiceConfig cfg = new ServiceConfig(benchOptions.benchFile(), benchOptions.driverFolder(),
                Home.root().resolve("plans"), Home.root().resolve("simulator"), location.data, runsOption.runs,
                calibrationOption.calibration, Home.version(), location.url, tablesOption.tables);
        CountDownLatch stop = new CountDownLatch(1);
        try (BenchService service = new BenchService(cfg); HttpApi api = new HttpApi(service, address, port, token)) {
            System.out.println("bench service for " + service.benchName() + " listening on http://"
                    + address.getHostAddress() + ":" + api.port() + "/");
            if (token != null) {
                System.out.println("access token required in header " + HttpApi.TOKEN_HEADER + ": see "
                        + location.data.resolve("service-token"));
            }
            System.out.flush();
            Runtime.getRuntime().addShutdownHook(new Thread(stop::countDown));
            stop.await();
        }
        return ExitCodes.PASS;
    }

    /** The access token, made at first start and kept readable by its owner only. */
    static String token(Path data) throws IOException {
        Path file = data.resolve("service-token");
        if (Files.isRegularFile(file)) {
            return Files.readString(file).trim();
        }
        Files.createDirectories(data);
        byte[] bytes = new byte[24];
        new SecureRandom().nextBytes(bytes);
        String t = HexFormat.of().formatHex(bytes);
        Files.writeString(file, t + "\n");
        try {
            Files.setPosixFilePermissions(file, PosixFilePermissions.fromString("rw-------"));
        } catch (UnsupportedOperationException notPosix) {
            // keep the platform's default
        }
        return t;
    }
}
