// lapsecalc board32 port: stdout/stdin on the host's file descriptors (mphal.c).
static inline void mp_hal_set_interrupt_char(char c) {
    (void)c;
}

// No pins (py/mphal.h would bring in extmod's virtual pins, not in this build).
#define mp_hal_pin_obj_t void *
