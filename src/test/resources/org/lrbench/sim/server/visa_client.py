"""A foreign client for lrbench's simulated bench: PyVISA with the pyvisa-py backend (code lrbench did not
write) drives the generator and the digitizer over raw TCP sockets, fits the two traces with NumPy's own
least squares and prints what it found as JSON. Usage: visa_client.py GENERATOR_PORT DIGITIZER_PORT"""
import json
import sys

import numpy as np
import pyvisa


def main():
    gen_port, dig_port = int(sys.argv[1]), int(sys.argv[2])
    rm = pyvisa.ResourceManager("@py")
    gen = rm.open_resource(f"TCPIP::127.0.0.1::{gen_port}::SOCKET", read_termination="\n", write_termination="\n",
                           timeout=5000)
    dig = rm.open_resource(f"TCPIP::127.0.0.1::{dig_port}::SOCKET", read_termination="\n", write_termination="\n",
                           timeout=5000)
    out = {"generator": gen.query("*IDN?").strip(), "digitizer": dig.query("*IDN?").strip()}
    f = 1000.0
    gen.write("*RST;*CLS;:OUTPut1:LOAD INFinity")
    gen.write(":SOURce1:FUNCtion:SHAPe SINusoid")
    gen.write(f":SOURce1:FREQuency:FIXed {f}")
    gen.write(":SOURce1:VOLTage:LEVel:IMMediate:AMPLitude 6.0")
    gen.write(":OUTPut1:STATe ON")
    # the generator's settings are done before the digitizer records (two links: nothing orders them but this)
    out["generator_complete"] = gen.query("*OPC?").strip()
    dig.write("*RST;*CLS;:FORMat:DATA INTeger,8;:FORMat:BORDer NORMal")
    dig.write(":SENSe1:VOLTage:RANGe 5.0;:SENSe2:VOLTage:RANGe 0.4")
    dig.write(":SENSe:SWEep:TINTerval 1E-6;:SENSe:SWEep:POINts 20000")
    dig.write(":TRIGger:SEQuence:SOURce CH1;LEVel 0;SLOPe POSitive")
    dig.write(":INITiate:IMMediate")
    out["complete"] = dig.query("*OPC?").strip()
    phasors = []
    for ch in (1, 2):
        x_inc, x_org, y_inc, y_org = (float(v) for v in dig.query(f":TRACe:SCALe? CH{ch}").split(","))
        codes = dig.query_binary_values(f":TRACe:DATA? CH{ch}", datatype="b", is_big_endian=True,
                                        container=np.array, header_fmt="ieee")
        volts = y_org + y_inc * codes.astype(float)
        t = x_org + x_inc * np.arange(len(volts))
        design = np.column_stack([np.cos(2 * np.pi * f * t), np.sin(2 * np.pi * f * t), np.ones_like(t)])
        (a, b, _), *_ = np.linalg.lstsq(design, volts, rcond=None)
        phasors.append(complex(a, -b))
    ratio = phasors[1] / phasors[0]
    out["ratio_magnitude"] = abs(ratio)
    out["ratio_phase"] = float(np.angle(ratio))
    gen.write(":OUTPut1:STATe OFF")
    dig.write(":BOGus:COMMand")
    out["first_error"] = dig.query(":SYSTem:ERRor?").strip()
    out["then"] = dig.query(":SYSTem:ERRor?").strip()
    print(json.dumps(out))


if __name__ == "__main__":
    main()
