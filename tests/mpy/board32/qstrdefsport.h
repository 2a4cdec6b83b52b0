// lapsecalc board32 port: no port-specific names.
