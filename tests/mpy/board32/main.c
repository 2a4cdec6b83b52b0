// lapsecalc board32: run one script under a fixed heap, on MicroPython's core built
// for 32-bit words and single-precision floats (mpconfigport.h).
//
//     micropython32 [-X heapsize=N[K|M]] SCRIPT [ARGS...]
//
// The script runs as __main__ with __file__ set, sys.argv = [SCRIPT, ARGS...] and
// sys.path[0] the script's folder as given ('' for a script in the current folder).
// Exit status: 0, the value of SystemExit, or 1 after an uncaught exception (its
// traceback goes to stderr).

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "py/builtin.h"
#include "py/compile.h"
#include "py/cstack.h"
#include "py/gc.h"
#include "py/lexer.h"
#include "py/mperrno.h"
#include "py/mphal.h"
#include "py/runtime.h"
#include "shared/runtime/gchelper.h"

#define DEFAULT_HEAP_BYTES (128 * 1024)
// The C stack the VM may use: the Unix port's figure for 32-bit words.
#define C_STACK_LIMIT_BYTES (40000)

// ---- the host's standard streams (py/mphal.h)

mp_uint_t mp_hal_stdout_tx_strn(const char *str, size_t len) {
    size_t done = 0;
    while (done < len) {
        ssize_t n = write(1, str + done, len - done);
        if (n <= 0) {
            break;
        }
        done += n;
    }
    return done;
}

void mp_hal_stdout_tx_strn_cooked(const char *str, size_t len) {
    mp_hal_stdout_tx_strn(str, len);
}

void mp_hal_stdout_tx_str(const char *str) {
    mp_hal_stdout_tx_strn(str, strlen(str));
}

int mp_hal_stdin_rx_chr(void) {
    unsigned char c;
    if (read(0, &c, 1) != 1) {
        return 4; // end of input reads as Ctrl-D
    }
    return c;
}

uintptr_t mp_hal_stdio_poll(uintptr_t poll_flags) {
    (void)poll_flags;
    return 0;
}

static void stderr_strn(void *env, const char *str, size_t len) {
    (void)env;
    ssize_t n = write(2, str, len);
    (void)n;
}

static const mp_print_t stderr_print = {NULL, stderr_strn};

// ---- the collector: registers and the C stack are roots, as on a board

void gc_collect(void) {
    gc_collect_start();
    gc_helper_collect_regs_and_stack();
    gc_collect_end();
}

// ---- imports from the host's file system

mp_import_stat_t mp_import_stat(const char *path) {
    struct stat st;
    if (stat(path, &st) == 0) {
        if (S_ISDIR(st.st_mode)) {
            return MP_IMPORT_STAT_DIR;
        }
        if (S_ISREG(st.st_mode)) {
            return MP_IMPORT_STAT_FILE;
        }
    }
    return MP_IMPORT_STAT_NO_EXIST;
}

void nlr_jump_fail(void *val) {
    (void)val;
    fprintf(stderr, "micropython32: uncaught NLR\n");
    exit(1);
}

// ---- running the script

static int uncaught(mp_obj_t exc) {
    mp_obj_base_t *e = MP_OBJ_TO_PTR(exc);
    if (mp_obj_is_subclass_fast(MP_OBJ_FROM_PTR(e->type), MP_OBJ_FROM_PTR(&mp_type_SystemExit))) {
        mp_obj_t value = mp_obj_exception_get_value(exc);
        mp_int_t code = 0;
        if (value != mp_const_none && !mp_obj_get_int_maybe(value, &code)) {
            mp_obj_print_helper(&stderr_print, value, PRINT_STR);
            mp_print_str(&stderr_print, "\n");
            code = 1;
        }
        return code & 255;
    }
    mp_obj_print_exception(&stderr_print, exc);
    return 1;
}

static int run_script(const char *path) {
    nlr_buf_t nlr;
    if (nlr_push(&nlr) == 0) {
        qstr name = qstr_from_str(path);
        mp_lexer_t *lex = mp_lexer_new_from_file(name);
        mp_store_global(MP_QSTR___file__, MP_OBJ_NEW_QSTR(name));
        mp_parse_tree_t tree = mp_parse(lex, MP_PARSE_FILE_INPUT);
        mp_obj_t code = mp_compile(&tree, name, false);
        mp_call_function_0(code);
        nlr_pop();
        return 0;
    }
    return uncaught(MP_OBJ_FROM_PTR(nlr.ret_val));
}

static int usage(const char *prog) {
    fprintf(stderr, "usage: %s [-X heapsize=N[K|M]] SCRIPT [ARGS...]\n", prog);
    return 2;
}

static long heap_bytes(const char *text) {
    char *end;
    long n = strtol(text, &end, 0);
    if (*end == 'K' || *end == 'k') {
        n *= 1024;
        end++;
    } else if (*end == 'M' || *end == 'm') {
        n *= 1024 * 1024;
        end++;
    }
    if (*end != '\0' || n < 1024) {
        return -1;
    }
    return n;
}

// Kept out of line so that everything it holds lies below the stack top main() sets.
MP_NOINLINE static int run(int argc, char **argv) {
    long heap_size = DEFAULT_HEAP_BYTES;
    int a = 1;
    while (a < argc && argv[a][0] == '-') {
        if (strcmp(argv[a], "-X") == 0 && a + 1 < argc
            && strncmp(argv[a + 1], "heapsize=", 9) == 0) {
            heap_size = heap_bytes(argv[a + 1] + 9);
            if (heap_size < 0) {
                return usage(argv[0]);
            }
            a += 2;
        } else {
            return usage(argv[0]);
        }
    }
    if (a >= argc) {
        return usage(argv[0]);
    }
    const char *script = argv[a];
    if (access(script, R_OK) != 0) {
        fprintf(stderr, "%s: can't open file '%s': [Errno %d] %s\n", argv[0], script, errno, strerror(errno));
        return 2;
    }

    char *heap = malloc(heap_size);
    if (heap == NULL) {
        fprintf(stderr, "%s: cannot allocate the heap\n", argv[0]);
        return 1;
    }
    gc_init(heap, heap + heap_size);
    mp_init();

    // sys.path[0]: the script's folder as given; sys.argv: the script and its arguments.
    const char *slash = strrchr(script, '/');
    mp_obj_list_store(mp_sys_path, MP_OBJ_NEW_SMALL_INT(0),
        slash == NULL ? MP_OBJ_NEW_QSTR(MP_QSTR_) : mp_obj_new_str(script, slash - script));
    for (int i = a; i < argc; i++) {
        mp_obj_list_append(mp_sys_argv, mp_obj_new_str(argv[i], strlen(argv[i])));
    }

    int ret = run_script(script);
    mp_deinit();
    free(heap);
    return ret;
}

int main(int argc, char **argv) {
    mp_cstack_init_with_sp_here(C_STACK_LIMIT_BYTES);
    return run(argc, argv);
}
