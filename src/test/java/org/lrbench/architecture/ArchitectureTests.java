package org.lrbench.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.classes;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;

import com.tngtech.archunit.core.domain.JavaCall;
import com.tngtech.archunit.core.domain.JavaClass;
import com.tngtech.archunit.core.domain.properties.HasOwner;
import com.tngtech.archunit.core.importer.ImportOption;
import com.tngtech.archunit.junit.AnalyzeClasses;
import com.tngtech.archunit.junit.ArchTest;
import com.tngtech.archunit.lang.ArchRule;
import org.lrbench.lot.LotRunner;
import org.lrbench.measure.SweepListener;
import org.lrbench.records.CheckStandardLog;
import org.lrbench.records.StoreLedger;

/**
 * The dependency rules of DEVELOPERS.md's architecture map, as code: a change that breaks one
 * fails the build, naming the class and the dependency.
 */
@AnalyzeClasses(packages = "org.lrbench", importOptions = ImportOption.DoNotIncludeTests.class)
class ArchitectureTests {

    @ArchTest
    static final ArchRule analysisIsPureNumerics = noClasses().that().resideInAPackage("org.lrbench.analysis..")
            .should().dependOnClassesThat().resideInAnyPackage("org.lrbench.transport..", "org.lrbench.scpi..",
                    "org.lrbench.driver..", "org.lrbench.store..", "org.lrbench.cli..", "org.lrbench.sim..",
                    "org.lrbench.run..", "org.lrbench.service..", "org.lrbench.measure..")
            .because("analysis is numerics on numbers, with no I/O, instruments or storage");

    @ArchTest
    static final ArchRule simulatorReachesNoRunner = noClasses().that().resideInAPackage("org.lrbench.sim..")
            .should().dependOnClassesThat().resideInAnyPackage("org.lrbench.run..", "org.lrbench.cli..",
                    "org.lrbench.service..", "org.lrbench.store..", "org.lrbench.records..")
            .because("the simulator models a bench; it does not run lots or keep records");

    @ArchTest
    static final ArchRule transportsKnowNoPlan = noClasses().that().resideInAPackage("org.lrbench.transport..")
            .should().dependOnClassesThat().resideInAnyPackage("org.lrbench.plan..", "org.lrbench.run..",
                    "org.lrbench.measure..", "org.lrbench.cli..", "org.lrbench.store..")
            .because("a transport moves bytes to one instrument and knows nothing of what they mean");

    @ArchTest
    static final ArchRule runnerKnowsSinksNotTheStoreOrConsole = noClasses().that().resideInAPackage("org.lrbench.run..")
            .should().dependOnClassesThat().resideInAnyPackage("org.lrbench.store..", "org.lrbench.cli..",
                    "org.lrbench.service..", "org.lrbench.records..", "org.lrbench.sim..")
            .because("the runner reports to listeners and a ledger (the store and the console sit behind them),"
                    + " and measures simulated parts through bench.SimulatedPart without building the simulator");

    @ArchTest
    static final ArchRule nothingBelowTheCliReachesIt = noClasses().that().resideOutsideOfPackage("org.lrbench.cli..")
            .should().dependOnClassesThat().resideInAPackage("org.lrbench.cli..")
            .because("the command line is the top of the map");

    @ArchTest
    static final ArchRule serviceReachesNoCli = noClasses().that().resideInAPackage("org.lrbench.service..")
            .should().dependOnClassesThat().resideInAPackage("org.lrbench.cli..");

    @ArchTest
    static final ArchRule realBenchCodeReachesNoSimulator = noClasses().that().resideInAnyPackage("org.lrbench.plan..",
                    "org.lrbench.measure..", "org.lrbench.calibration..", "org.lrbench.judge..", "org.lrbench.uncertainty..",
                    "org.lrbench.sampling..", "org.lrbench.results..", "org.lrbench.store..", "org.lrbench.records..",
                    "org.lrbench.transport", "org.lrbench.scpi..", "org.lrbench.driver..", "org.lrbench.fixture..")
            .should().dependOnClassesThat().resideInAPackage("org.lrbench.sim..")
            .because("plans, sweeps, corrections and records are the same on a real bench; the fixture's wiring"
                    + " belongs to real fixtures (package fixture)");

    @ArchTest
    static final ArchRule onlyTheCommandLineWritesToTheConsole = noClasses().that()
            .resideOutsideOfPackages("org.lrbench.cli..", "org.lrbench.benchmark..")
            .should().accessField(System.class, "out").orShould().accessField(System.class, "err")
            .because("below the command line, output goes to listeners, sinks, a given stream or the log");

    @ArchTest
    static final ArchRule onlyTheLotPackageStartsALot = noClasses().that().resideOutsideOfPackage("org.lrbench.lot..")
            .should().callConstructorWhere(JavaCall.Predicates.target(HasOwner.Predicates.With.owner(
                    JavaClass.Predicates.equivalentTo(LotRunner.Setup.class))))
            .orShould().callConstructorWhere(JavaCall.Predicates.target(HasOwner.Predicates.With.owner(
                    JavaClass.Predicates.equivalentTo(StoreLedger.class))))
            .orShould().callMethod(CheckStandardLog.class, "override", java.time.Instant.class, String.class,
                    String.class, String.class, String.class)
            .because("a lot starts in one place, lot.LotStart (validation, check gate, corrections, plan identity,"
                    + " scheme, preflight), whoever asks for it: the command line, the demo or the service");

    @ArchTest
    static final ArchRule theSweepHearsItsObserversThroughTheirGuard = classes().that().haveFullyQualifiedName(
                    "org.lrbench.measure.SweepRunner")
            .should().callMethod(SweepListener.class, "isolated", SweepListener.class)
            .because("an observer cannot throw into the runner: SweepRunner.run calls its listener only through"
                    + " SweepListener.isolated (run.ObserverTests shows a throwing listener changes nothing)");

    @ArchTest
    static final ArchRule noPackageCycles = slices().matching("org.lrbench.(*)..").should().beFreeOfCycles();
}
