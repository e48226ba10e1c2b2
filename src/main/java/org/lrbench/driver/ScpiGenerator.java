package org.lrbench.driver;

import java.util.Locale;
import java.util.Map;
import org.lrbench.instrument.Generator;
import org.lrbench.instrument.Waveform;
import org.lrbench.scpi.ScpiNumbers;
import org.lrbench.scpi.ScpiSession;

/** A generator that speaks SCPI through a source driver file. */
public final class ScpiGenerator extends DrivenInstrument implements Generator {

    public ScpiGenerator(ScpiSession session, DriverFile driver) {
        super(session, driver);
    }

    @Override
    public double frequencySettleSecond() {
        return driver.frequencySettleSecond();
    }

    @Override
    public void prepare() {
        super.prepare();
        outputOff();
    }

    @Override
    public void setWaveform(Waveform waveform) {
        configure("waveform", Map.of("shape", driver.word("shapes", waveform.name().toLowerCase(Locale.ROOT))));
    }

    @Override
    public void setFrequency(double hertz) {
        configure("frequency", Map.of("frequency", ScpiNumbers.nr3(hertz)));
    }

    @Override
    public void setAmplitude(double peakVolt) {
        double setting = peakVolt * driver.levelPerEmf();
        configure("amplitude", Map.of("amplitude_vpk", ScpiNumbers.nr3(setting),
                "amplitude_vpp", ScpiNumbers.nr3(2 * setting)));
    }

    @Override
    public void setOffset(double volt) {
        configure("offset", Map.of("offset", ScpiNumbers.nr3(volt * driver.levelPerEmf())));
    }

    @Override
    public void outputOn() {
        configure("output_on", Map.of());
    }

    @Override
    public void outputOff() {
        configure("output_off", Map.of());
    }
}
