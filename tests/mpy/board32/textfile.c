// lapsecalc board32: open(path[, mode]) for reading a text file from the host's file
// system, as a stream (py/stream.c): read, readline, readlines, iteration, close,
// and use in a with statement. Like a board's file object it is one small heap object
// with a finaliser; each line read is a new string.

#include <errno.h>
#include <fcntl.h>
#include <string.h>
#include <unistd.h>

#include "py/builtin.h"
#include "py/runtime.h"
#include "py/stream.h"

typedef struct _board32_textfile_t {
    mp_obj_base_t base;
    int fd;
} board32_textfile_t;

static mp_uint_t textfile_read(mp_obj_t self_in, void *buf, mp_uint_t size, int *errcode) {
    board32_textfile_t *self = MP_OBJ_TO_PTR(self_in);
    if (self->fd < 0) {
        *errcode = MP_EBADF;
        return MP_STREAM_ERROR;
    }
    ssize_t n = read(self->fd, buf, size);
    if (n < 0) {
        *errcode = errno;
        return MP_STREAM_ERROR;
    }
    return (mp_uint_t)n;
}

static mp_uint_t textfile_ioctl(mp_obj_t self_in, mp_uint_t request, uintptr_t arg, int *errcode) {
    board32_textfile_t *self = MP_OBJ_TO_PTR(self_in);
    (void)arg;
    if (request == MP_STREAM_CLOSE) {
        if (self->fd >= 0) {
            close(self->fd);
            self->fd = -1;
        }
        return 0;
    }
    *errcode = MP_EINVAL;
    return MP_STREAM_ERROR;
}

static const mp_stream_p_t textfile_stream = {
    .read = textfile_read,
    .write = NULL,
    .ioctl = textfile_ioctl,
    .is_text = true,
};

static const mp_rom_map_elem_t textfile_locals_table[] = {
    { MP_ROM_QSTR(MP_QSTR_read), MP_ROM_PTR(&mp_stream_read_obj) },
    { MP_ROM_QSTR(MP_QSTR_readline), MP_ROM_PTR(&mp_stream_unbuffered_readline_obj) },
    { MP_ROM_QSTR(MP_QSTR_readlines), MP_ROM_PTR(&mp_stream_unbuffered_readlines_obj) },
    { MP_ROM_QSTR(MP_QSTR_close), MP_ROM_PTR(&mp_stream_close_obj) },
    { MP_ROM_QSTR(MP_QSTR___del__), MP_ROM_PTR(&mp_stream_close_obj) },
    { MP_ROM_QSTR(MP_QSTR___enter__), MP_ROM_PTR(&mp_identity_obj) },
    { MP_ROM_QSTR(MP_QSTR___exit__), MP_ROM_PTR(&mp_stream___exit___obj) },
};
static MP_DEFINE_CONST_DICT(textfile_locals_dict, textfile_locals_table);

static MP_DEFINE_CONST_OBJ_TYPE(
    board32_textfile_type,
    MP_QSTR_TextIOWrapper,
    MP_TYPE_FLAG_ITER_IS_STREAM,
    protocol, &textfile_stream,
    locals_dict, &textfile_locals_dict
    );

mp_obj_t mp_builtin_open(size_t n_args, const mp_obj_t *args, mp_map_t *kwargs) {
    (void)kwargs;
    const char *path = mp_obj_str_get_str(args[0]);
    if (n_args > 1) {
        const char *mode = mp_obj_str_get_str(args[1]);
        if (strcmp(mode, "r") != 0 && strcmp(mode, "rt") != 0) {
            mp_raise_ValueError(MP_ERROR_TEXT("this port opens text files for reading only"));
        }
    }
    int fd = open(path, O_RDONLY);
    if (fd < 0) {
        mp_raise_OSError(errno);
    }
    board32_textfile_t *f = mp_obj_malloc_with_finaliser(board32_textfile_t, &board32_textfile_type);
    f->fd = fd;
    return MP_OBJ_FROM_PTR(f);
}
MP_DEFINE_CONST_FUN_OBJ_KW(mp_builtin_open_obj, 1, mp_builtin_open);
