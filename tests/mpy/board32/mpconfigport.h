// lapsecalc's measuring port: MicroPython's core (py/) built for 32-bit words with
// single-precision floats, configured the way a typical 32-bit board port is, so that
// the heap a script needs under -X heapsize is the heap it needs on such a board.
// Not a board: there is no flash, no VFS, no hardware module; .mpy code is loaded into
// the heap from the host's file system (as on a board without ROMFS or frozen code).

#include <stdint.h>

#define MICROPY_CONFIG_ROM_LEVEL (MICROPY_CONFIG_ROM_LEVEL_EXTRA_FEATURES)

// What the board measure is about: 32-bit words (built with gcc -m32), boxed
// single-precision floats (a float is one 16-byte heap block), arbitrary-size ints.
#define MICROPY_OBJ_REPR (MICROPY_OBJ_REPR_A)
#define MICROPY_FLOAT_IMPL (MICROPY_FLOAT_IMPL_FLOAT)
#define MICROPY_LONGINT_IMPL (MICROPY_LONGINT_IMPL_MPZ)

// Heap and collector as on a board port.
#define MICROPY_ENABLE_GC (1)
#define MICROPY_ENABLE_FINALISER (1)
#define MICROPY_ENABLE_EMERGENCY_EXCEPTION_BUF (1)
#define MICROPY_EMERGENCY_EXCEPTION_BUF_SIZE (256)
#define MICROPY_STACK_CHECK (1)

// Code: the compiler (for the driver scripts) and loading .mpy files.
#define MICROPY_ENABLE_COMPILER (1)
#define MICROPY_PERSISTENT_CODE_LOAD (1)
#define MICROPY_READER_POSIX (1)
#define MICROPY_ENABLE_EXTERNAL_IMPORT (1)
#define MICROPY_PY___FILE__ (1)
#define MICROPY_ALLOC_PATH_MAX (256)

// No native code emitters, no REPL, no threads, no frozen modules, no VFS.
#define MICROPY_EMIT_X86 (0)
#define MICROPY_HELPER_REPL (0)
#define MICROPY_PY_THREAD (0)
#define MICROPY_MODULE_FROZEN_MPY (0)
#define MICROPY_MODULE_FROZEN_STR (0)
#define MICROPY_VFS (0)
#define MICROPY_KBD_EXCEPTION (0)
#define MICROPY_PY_BUILTINS_INPUT (0)
#define MICROPY_PY_BUILTINS_HELP (0)

// Modules: builtins, gc, micropython, sys, math (all in py/); io with a read-only
// text open() of this port (textfile.c). Modules a board has from extmod/ (os, time,
// json, machine...) are not in this build: the measured scripts do not use them.
#define MICROPY_PY_GC (1)
#define MICROPY_PY_MICROPYTHON (1)
#define MICROPY_PY_MICROPYTHON_MEM_INFO (1)
#define MICROPY_PY_SYS (1)
#define MICROPY_PY_SYS_PATH (1)
#define MICROPY_PY_SYS_ARGV (1)
#define MICROPY_PY_SYS_MODULES (1)
#define MICROPY_PY_SYS_MAXSIZE (1)
#define MICROPY_PY_SYS_EXIT (1)
#define MICROPY_PY_SYS_STDFILES (1)
#define MICROPY_PY_SYS_PLATFORM "board32"
#define MICROPY_PY_MATH (1)
#define MICROPY_PY_IO (1)

#define MICROPY_PY_ASYNCIO (0)
#define MICROPY_PY_JSON (0)
#define MICROPY_PY_RE (0)
#define MICROPY_PY_HEAPQ (0)
#define MICROPY_PY_HASHLIB (0)
#define MICROPY_PY_BINASCII (0)
#define MICROPY_PY_RANDOM (0)
#define MICROPY_PY_SELECT (0)
#define MICROPY_PY_TIME (0)
#define MICROPY_PY_OS (0)
#define MICROPY_PY_DEFLATE (0)
#define MICROPY_PY_FRAMEBUF (0)
#define MICROPY_PY_PLATFORM (0)
#define MICROPY_PY_MACHINE (0)
#define MICROPY_PY_CRYPTOLIB (0)
#define MICROPY_PY_UCTYPES (0)
#define MICROPY_PY_VFS (0)

#define MICROPY_USE_INTERNAL_ERRNO (0)
#define MICROPY_HW_BOARD_NAME "lapsecalc board32 (host, gcc -m32)"
#define MICROPY_HW_MCU_NAME "none"

typedef long mp_off_t;

#include <alloca.h>

#define MP_STATE_PORT MP_STATE_VM
